import { formatFileSize } from '../../../../shared/units.ts';
import { Card } from '../../../components/ui/card.tsx';
import { EXPORT_HREF } from '../api/delete-account.ts';
import { useStorageUsage } from '../api/get-storage.ts';

/** From this share of the quota on, the card says how to make room before an upload is refused. */
const NEARLY_FULL_SHARE = 0.9;

/** "Storage: 12.3 MB of 500 MB used" for the original files, with a bar and, near the limit, what to do. */
function StorageLine() {
  const storage = useStorageUsage();
  if (storage.isPending) return <p className="mt-3 text-sm text-ink-muted">Reading how much storage your files use…</p>;
  if (storage.isError || !storage.data) return null;
  const { used_bytes, quota_bytes, files } = storage.data;
  const share = quota_bytes > 0 ? Math.min(1, used_bytes / quota_bytes) : 0;
  return (
    <div className="mt-3">
      <p className="text-sm" id="storage-used">
        Storage: {formatFileSize(used_bytes)} of {formatFileSize(quota_bytes)} used ({files}{' '}
        {files === 1 ? 'original file' : 'original files'})
      </p>
      <meter
        className="mt-1 block h-2 w-full max-w-sm"
        min={0}
        max={1}
        low={NEARLY_FULL_SHARE}
        high={NEARLY_FULL_SHARE}
        optimum={0}
        value={share}
        aria-labelledby="storage-used"
      />
      {share >= NEARLY_FULL_SHARE && (
        <p className="mt-1 text-sm text-ink">
          Your storage is nearly full. New uploads are refused once it is full: download all your data, then delete runs you no
          longer need to make room.
        </p>
      )}
    </div>
  );
}

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
      <StorageLine />
    </Card>
  );
}
