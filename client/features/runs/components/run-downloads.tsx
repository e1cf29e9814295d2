import { runDownloads } from '../api/get-run.ts';

const LINK =
  'tap-target inline-flex items-center rounded-md border border-line bg-card px-2.5 py-1 font-semibold text-teal hover:border-teal';

/** Plain links: the browser downloads the files itself, with the session cookie. */
export function RunDownloads({ runId }: { runId: string }) {
  return (
    <nav aria-label="Downloads" className="flex flex-wrap items-center gap-2 text-sm">
      <span className="text-ink-muted">Download</span>
      <a className={LINK} href={runDownloads.splitsCsv(runId, 'mi')} download>
        CSV (mi)
      </a>
      <a className={LINK} href={runDownloads.splitsCsv(runId, 'km')} download>
        CSV (km)
      </a>
      <a className={LINK} href={runDownloads.original(runId)} download>
        Original file
      </a>
    </nav>
  );
}
