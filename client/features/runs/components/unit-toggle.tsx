import { UNITS, type Unit } from '../../../../shared/users/schemas.ts';

type UnitToggleProps = { label: string; value: Unit; onChange: (unit: Unit) => void };

/** mi | km radio pair for one part of a page (the top bar's switch saves to the profile instead). */
export function UnitToggle({ label, value, onChange }: UnitToggleProps) {
  return (
    <fieldset className="flex rounded-md border border-line bg-card p-0.5 text-sm">
      <legend className="sr-only">{label}</legend>
      {UNITS.map((unit) => (
        <label key={unit} className="relative flex cursor-pointer">
          <input
            type="radio"
            name={label}
            value={unit}
            checked={value === unit}
            onChange={() => onChange(unit)}
            className="peer absolute inset-0 cursor-pointer opacity-0"
          />
          <span className="flex tap-target items-center justify-center rounded px-2.5 py-0.5 font-semibold text-ink-muted peer-checked:bg-teal peer-checked:text-white peer-focus-visible:outline-2 peer-focus-visible:outline-offset-1 peer-focus-visible:outline-teal">
            {unit}
          </span>
        </label>
      ))}
    </fieldset>
  );
}
