import { Button } from '../../../components/ui/button.tsx';
import type { DigestReceipt as Receipt } from '../api/types.ts';
import { formatDay } from '../utils/week-format.ts';

/** What the digest e-mail said, heading by heading, so the coach knows what went out. */
export function DigestReceipt({ receipt, onDone }: { receipt: Receipt; onDone: () => void }) {
  return (
    <div role="status" className="flex flex-col gap-2 rounded-md border-l-4 border-teal bg-teal-wash px-3 py-2 text-sm">
      <p className="font-semibold text-teal-deep">
        Weekly digest for the week of {formatDay(receipt.week_start)} sent to {receipt.sent_to}.
      </p>
      <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[max-content_1fr]">
        {Object.entries(receipt.groups).map(([heading, names]) => (
          <div key={heading} className="contents">
            <dt className="font-semibold">
              {heading} ({names.length})
            </dt>
            <dd className="text-ink-muted">{names.length ? names.join(', ') : 'nobody'}</dd>
          </div>
        ))}
      </dl>
      <Button variant="quiet" className="-ml-3.5 self-start" onClick={onDone}>
        Dismiss
      </Button>
    </div>
  );
}
