import { useId } from 'react';
import { useProfile } from '../api/get-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';

/** A coach's e-mail on each import by a squad runner; saved as soon as it is ticked or cleared. */
export function ImportNoticeToggle() {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  const hintId = useId();
  // Show the new choice while the save is in flight; on failure it falls back to the saved one.
  const checked = mutation.isPending
    ? (mutation.variables.notify_on_import ?? profile.notify_on_import)
    : profile.notify_on_import;

  return (
    <div className="flex flex-col gap-2">
      <label className="flex cursor-pointer items-start gap-3">
        <input
          type="checkbox"
          checked={checked}
          aria-describedby={hintId}
          onChange={(event) => mutation.mutate({ notify_on_import: event.target.checked })}
          className="mt-1 size-4 accent-teal"
        />
        <span className="font-semibold">E-mail me when a runner in my squads imports a run</span>
      </label>
      <p id={hintId} className="pl-7 text-sm text-ink-muted">
        One short message per upload, with links to the runs.
      </p>
      {mutation.isError && (
        <p role="alert" className="pl-7 text-sm font-semibold text-tartan">
          Not saved: {mutation.error.message}
        </p>
      )}
      {mutation.isSuccess && (
        <p role="status" className="pl-7 text-sm">
          {mutation.data.notify_on_import ? 'Notices are on.' : 'Notices are off.'}
        </p>
      )}
    </div>
  );
}
