import { UNITS } from '../../../../shared/users/schemas.ts';
import { useProfile } from '../api/get-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';

/** The mi | km switch of the top bar; it saves to the profile straight away. */
export function UnitSwitch() {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  // Show the chosen unit while the save is in flight; on failure it falls back to the saved one.
  const unit = (mutation.isPending && mutation.variables.unit) || profile.unit;

  return (
    <div className="relative">
      <fieldset className="flex rounded-md border border-line bg-card p-0.5 text-sm">
        <legend className="sr-only">Distance unit</legend>
        {UNITS.map((value) => (
          <label key={value} className="flex cursor-pointer">
            <input
              type="radio"
              name="distance-unit"
              value={value}
              checked={unit === value}
              onChange={() => mutation.mutate({ unit: value })}
              className="peer sr-only"
            />
            <span className="flex tap-target items-center justify-center rounded px-2.5 py-0.5 font-semibold text-ink-muted peer-checked:bg-teal peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-1 peer-focus-visible:outline-teal">
              {value}
            </span>
          </label>
        ))}
      </fieldset>
      {mutation.isError && (
        <p
          role="alert"
          className="absolute top-full right-0 z-20 mt-1 w-56 rounded-md border border-tartan bg-card p-2 text-sm text-tartan shadow"
        >
          Units not saved: {mutation.error.message}
        </p>
      )}
    </div>
  );
}
