import type { QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { PageHeader } from '../../../components/ui/page-header.tsx';
import { paths } from '../../../config/paths.ts';
import { outboxQueryOptions } from '../../../features/outbox/api/get-outbox.ts';
import { OutboxView } from '../../../features/outbox/components/outbox-view.tsx';

export const createLoader = (queryClient: QueryClient) => async () => {
  // prefetch, not ensure: the 404 of a production server is an answer this page explains.
  await queryClient.prefetchQuery(outboxQueryOptions());
  return null;
};

/** `/dev/outbox`: the e-mail the app sent, as caught on loopback in development and tests. No sign-in needed. */
export default function OutboxRoute() {
  return (
    <div className="min-h-dvh">
      <header className="border-b border-line">
        <div className="mx-auto flex h-14 max-w-6xl items-center px-4">
          <Link to={paths.log.getHref()} className="text-xl font-bold tracking-tight text-ink">
            Pacewright
          </Link>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6">
        <PageHeader title="Outbox">
          E-mail the app sent while running in development: invitations, password reset links, import notices and digests. Nothing
          here left this computer.
        </PageHeader>
        <OutboxView />
      </main>
    </div>
  );
}
