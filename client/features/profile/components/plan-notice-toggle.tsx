import { useId } from 'react';
import { useProfile } from '../api/get-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';

/** A runner's e-mail when a coach changes their plan (one per editing burst); saved as soon as it is ticked or cleared. */
export function PlanNoticeToggle() {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  const hintId = useId();
  // Show the new choice while the save is in flight; on failure it falls back to the saved one.
  const checked = mutation.isPending
    ? (mutation.variables.notify_on_plan_change ?? profile.notify_on_plan_change)
    : profile.notify_on_plan_change;

  return (
    <div className="flex flex-col gap-2">
      <label className="flex min-h-11 cursor-pointer items-start gap-3 sm:min-h-0">
        <input
          type="checkbox"
          checked={checked}
          aria-describedby={hintId}
          onChange={(event) => mutation.mutate({ notify_on_plan_change: event.target.checked })}
          className="mt-1 size-4 accent-teal"
        />
        <span className="font-semibold">E-mail me when my coach changes my plan</span>
      </label>
      <p id={hintId} className="pl-7 text-sm text-ink-muted">
        One message once your coach has finished a round of changes (10 minutes after the last one), listing them.
      </p>
      {mutation.isError && (
        <p role="alert" className="pl-7 text-sm font-semibold text-tartan">
          Not saved: {mutation.error.message}
        </p>
      )}
      {mutation.isSuccess && (
        <p role="status" className="pl-7 text-sm">
          {mutation.data.notify_on_plan_change ? 'Plan change notices are on.' : 'Plan change notices are off.'}
        </p>
      )}
    </div>
  );
}
