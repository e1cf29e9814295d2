import { Fragment } from 'react';

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;
const LOOPBACK_HOSTS = new Set(['127.0.0.1', 'localhost', '[::1]']);

/**
 * Where a link in a caught message should go from this page. Links to a loopback address are the
 * app's own (PUBLIC_URL defaults to the server's address, whose port may be Vite's neighbour or a
 * test server's free port); they open on this page's own address so they always reach the app.
 */
function hrefOf(url: string): string {
  try {
    const parsed = new URL(url);
    return LOOPBACK_HOSTS.has(parsed.hostname) ? `${parsed.pathname}${parsed.search}${parsed.hash}` : url;
  } catch {
    return url;
  }
}

/** A message's plain-text part with its web addresses made clickable; the text is never parsed as HTML. */
export function MessageText({ text }: { text: string }) {
  const pieces = text.split(URL_PATTERN);
  return (
    <p className="font-sans break-words whitespace-pre-wrap">
      {pieces.map((piece, index) =>
        // split() with a capturing group puts every match at an odd index.
        index % 2 === 1 ? (
          <a key={index} href={hrefOf(piece)} className="font-semibold text-teal underline">
            {piece}
          </a>
        ) : (
          <Fragment key={index}>{piece}</Fragment>
        ),
      )}
    </p>
  );
}
