import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { requireAccess } from '../../guards.ts';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    await requireAccess(queryClient, request, 'squads:manage');
    return null;
  };

export default function SquadRoute() {
  return (
    <>
      <PageHeader title="Squad">Your runners’ weeks, side by side.</PageHeader>
      <EmptyState title="No squad yet.">
        <p>
          Creating a squad and inviting runners by e-mail arrive with the squad feature. You will then see each runner’s week
          here: planned against run volume, sessions run as planned, and flags such as a sharp jump in weekly volume or a missed
          long run.
        </p>
        <p>A week review per runner brings the plan, the runs, the load trend and your notes together.</p>
      </EmptyState>
    </>
  );
}
