import type { PaceUnit } from '../../../../shared/race/paces.ts';

const UNITS: readonly PaceUnit[] = ['mi', 'km'];

type SplitUnitSwitchProps = { value: PaceUnit; onChange: (unit: PaceUnit) => void };

/** mi | km radio pair for the split table; changing it redraws the table at once. */
export function SplitUnitSwitch({ value, onChange }: SplitUnitSwitchProps) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="mb-1 text-sm font-semibold">Splits per</legend>
      <div className="flex w-fit rounded-md border border-line-strong bg-white p-0.5 text-sm">
        {UNITS.map((unit) => (
          <label key={unit} className="flex cursor-pointer">
            <input
              type="radio"
              name="unit"
              value={unit}
              checked={value === unit}
              onChange={() => onChange(unit)}
              className="peer sr-only"
            />
            <span className="flex tap-target items-center justify-center rounded px-3 py-1.5 font-semibold text-ink-muted peer-checked:bg-teal peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-1 peer-focus-visible:outline-teal">
              {unit === 'mi' ? 'mile' : 'km'}
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}
