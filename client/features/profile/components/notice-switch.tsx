import { useId } from 'react';
import { NOTICE_KIND_INFO, type NoticeKind } from '../../../../shared/notices/kinds.ts';
import { useHeldChoice } from '../../../lib/use-held-choice.ts';
import { useSetNoticeSwitch } from '../api/notice-switches.ts';

/** One kind of notice e-mail, on or off; saved as soon as it is ticked or cleared. */
export function NoticeSwitch({ kind, on }: { kind: NoticeKind; on: boolean }) {
  const mutation = useSetNoticeSwitch(kind);
  const hintId = useId();
  const info = NOTICE_KIND_INFO[kind];
  // The new choice shows at once and while the save is in flight; on failure it falls back to the saved one.
  const { shown: checked, hold, release } = useHeldChoice(on);

  return (
    <li className="flex flex-col gap-1">
      <label className="flex min-h-11 cursor-pointer items-start gap-3 sm:min-h-0">
        <input
          type="checkbox"
          checked={checked}
          aria-describedby={hintId}
          onChange={(event) => {
            hold(event.target.checked);
            mutation.mutate(event.target.checked, { onError: release });
          }}
          className="mt-1 size-4 accent-teal"
        />
        <span className="font-semibold">{info.label}</span>
      </label>
      <p id={hintId} className="pl-7 text-sm text-ink-muted">
        {info.hint}
      </p>
      {mutation.isError && (
        <p role="alert" className="pl-7 text-sm font-semibold text-tartan">
          Not saved: {mutation.error.message}
        </p>
      )}
      {mutation.isSuccess && (
        <p role="status" className="pl-7 text-sm">
          {mutation.data[kind] ? 'On: these e-mails are sent.' : 'Off: no more of these e-mails.'}
        </p>
      )}
    </li>
  );
}
