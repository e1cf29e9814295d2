import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Card } from '../../../components/ui/card.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { healthQueryOptions } from '../../../features/admin/api/get-health.ts';
import { usersQueryOptions } from '../../../features/admin/api/get-users.ts';
import { ServiceHealth } from '../../../features/admin/components/service-health.tsx';
import { UsersTable } from '../../../features/admin/components/users-table.tsx';
import { useMe } from '../../../features/auth/api/get-me.ts';
import { requireAccess } from '../../guards.ts';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireAccess(queryClient, request, 'users:manage');
    void queryClient.prefetchQuery(healthQueryOptions());
    await queryClient.ensureQueryData(usersQueryOptions());
    return null;
  };

export default function AdminRoute() {
  const me = useMe();
  return (
    <>
      <PageHeader title="Admin">Accounts, their roles, and whether the service is healthy.</PageHeader>
      <div className="grid gap-4 lg:grid-cols-[1fr_18rem] lg:items-start">
        <Card title="Users">{me && <UsersTable currentUserId={me.id} />}</Card>
        <Card title="Service health">
          <ServiceHealth />
        </Card>
      </div>
    </>
  );
}
