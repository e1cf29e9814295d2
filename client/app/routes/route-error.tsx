import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Button } from '../../components/ui/button.tsx';
import { LinkButton } from '../../components/ui/link-button.tsx';
import { paths } from '../../config/paths.ts';
import { isApiError } from '../../lib/api-client.ts';

/** Shown in place of a page whose loader or rendering failed; inside the app the top bar stays around it. */
export function RouteError() {
  const error = useRouteError();
  const notFound = (isRouteErrorResponse(error) && error.status === 404) || isApiError(error, 404);
  const title = notFound ? 'No page at this address' : 'This page could not be shown';
  const message = notFound
    ? 'The link may be mistyped, or what it pointed to is not there any more.'
    : isApiError(error)
      ? error.message
      : 'Something unexpected happened while showing this page.';

  return (
    <div role="alert" className="mx-auto flex max-w-md flex-col gap-3 py-10">
      <title>{`${title} · Pacewright`}</title>
      <h1 className="text-2xl font-bold">{title}</h1>
      <p>{message}</p>
      <div className="flex flex-wrap gap-3">
        {!notFound && <Button onClick={() => window.location.reload()}>Try again</Button>}
        <LinkButton to={paths.log.getHref()}>Go to your log</LinkButton>
      </div>
    </div>
  );
}

/** The last resort, when even the layout could not load. */
export function RootError() {
  return (
    <main className="px-4">
      <RouteError />
    </main>
  );
}
