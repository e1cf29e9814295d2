import { LinkButton } from '../../components/ui/link-button.tsx';
import { paths } from '../../config/paths.ts';

export function NotFound() {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-3 px-4">
      <title>Page not found · Pacewright</title>
      <p className="text-xl font-bold tracking-tight">Pacewright</p>
      <h1 className="text-2xl font-bold">No page at this address</h1>
      <p className="text-ink-muted">The link may be mistyped, or the page may have moved.</p>
      <div>
        <LinkButton to={paths.log.getHref()}>Go to your log</LinkButton>
      </div>
    </main>
  );
}
