import { SECONDARY_LINK } from './link-button.tsx';

/** A plain download link (a CSV of the week, the squad or the fees) with the secondary-button look. */
export function DownloadLink({ href, children }: { href: string; children: string }) {
  return (
    <a href={href} download className={SECONDARY_LINK}>
      {children}
    </a>
  );
}
