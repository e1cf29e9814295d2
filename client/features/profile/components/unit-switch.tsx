import { UNITS } from '../../../../shared/users/schemas.ts';
import { useUnitChoice } from '../api/use-unit-choice.ts';

/** The mi | km switch of the top bar; it saves to the profile straight away. */
export function UnitSwitch() {
  const { unit, choose, error } = useUnitChoice();

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
              onChange={() => choose(value)}
              className="peer sr-only"
            />
            <span className="flex tap-target items-center justify-center rounded px-2.5 py-0.5 font-semibold text-ink-muted peer-checked:bg-teal peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-1 peer-focus-visible:outline-teal">
              {value}
            </span>
          </label>
        ))}
      </fieldset>
      {error && (
        <p
          role="alert"
          className="absolute top-full right-0 z-20 mt-1 w-56 rounded-md border border-tartan bg-card p-2 text-sm text-tartan shadow"
        >
          Units not saved: {error.message}
        </p>
      )}
    </div>
  );
}
