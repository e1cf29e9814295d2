import { Card } from '../../../components/ui/card.tsx';
import { EXPORT_HREF } from '../api/delete-account.ts';

/** "Download all my data": the streamed .zip of GET /api/me/export, with what is in it. */
export function YourDataCard() {
  return (
    <Card title="Your data" description="Everything you have put into Pacewright, any time, in open formats.">
      <a
        href={EXPORT_HREF}
        download
        className="inline-flex tap-target items-center self-start rounded-md bg-teal px-3.5 py-1.5 text-sm font-semibold text-white hover:bg-teal-deep"
      >
        Download all my data (.zip)
      </a>
      <p className="mt-2 text-sm text-ink-muted">
        The .zip holds your original watch files, your runs and their splits as CSV (per mile and per kilometre), your session
        plans, fuel items and fuel plans, run notes, race results, goal race and profile. It is built while it downloads, so a
        large history takes a moment to start.
      </p>
    </Card>
  );
}
