import { useId, type ReactNode } from 'react';
import {
  moveEntry,
  newDraftPart,
  type DraftAmountUnit,
  type DraftErrors,
  type DraftItem,
  type DraftPart,
  type DraftRepeat,
  type DraftTargetType,
} from '../../../../shared/plans/builder.ts';
import { PACE_PERS, PART_KINDS, RELATIVE_PACE_REFS } from '../../../../shared/plans/types.ts';
import { raceNamedPaceLabel } from '../../../../shared/race/training-ranges.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CONTROL_CLASSES } from '../../../components/ui/field.tsx';
import { cn } from '../../../lib/cn.ts';

type SessionBuilderProps = {
  draft: DraftItem[];
  errors: DraftErrors;
  onChange: (draft: DraftItem[]) => void;
  /** A fresh key for a new row. */
  nextId: () => string;
};

const UNIT_LABELS: Record<DraftAmountUnit, string> = { mi: 'mi', km: 'km', m: 'm', time: 'min:sec' };
const TARGET_LABELS: Record<DraftTargetType, string> = {
  pace: 'Pace range',
  relative: 'Race effort',
  heart_rate: 'Heart rate',
  effort: 'Effort only',
};
const PER_LABELS: Record<(typeof PACE_PERS)[number], string> = { mi: 'per mi', km: 'per km', rep: "for the part's distance" };
/** "Marathon effort (@ MP)": the Tools page's words for each race-named pace, with its shorthand. */
const refLabel = (ref: (typeof RELATIVE_PACE_REFS)[number]): string => `${raceNamedPaceLabel(ref)} (@ ${ref})`;

/**
 * The form way of writing a session: parts and repeats in order, each movable with buttons (so the
 * keyboard can reorder too), with the same kinds, amounts and targets as the shorthand.
 */
export function SessionBuilder({ draft, errors, onChange, nextId }: SessionBuilderProps) {
  const replace = (index: number, item: DraftItem) => onChange(draft.map((it, i) => (i === index ? item : it)));
  return (
    <div className="flex flex-col gap-2">
      {draft.length === 0 ? (
        <p className="rounded-md border border-dashed border-line-strong px-3 py-4 text-center text-sm text-ink-muted">
          No parts yet. Add a part or a repeat, or write the shorthand above.
        </p>
      ) : (
        <ol className="flex flex-col gap-2" aria-label="Parts of the session">
          {draft.map((item, index) => {
            const name = `${item.type === 'repeat' ? 'repeat' : 'part'} ${index + 1}`;
            const controls = (
              <RowControls
                name={name}
                canUp={index > 0}
                canDown={index < draft.length - 1}
                onMove={(by) => onChange(moveEntry(draft, index, by))}
                onDelete={() => onChange(draft.filter((_, i) => i !== index))}
              />
            );
            return (
              <li key={item.id}>
                {item.type === 'part' ? (
                  <PartRow
                    part={item}
                    name={name}
                    errors={errors}
                    onChange={(part) => replace(index, part)}
                    controls={controls}
                  />
                ) : (
                  <RepeatBlock
                    repeat={item}
                    name={name}
                    errors={errors}
                    onChange={(repeat) => replace(index, repeat)}
                    nextId={nextId}
                    controls={controls}
                  />
                )}
              </li>
            );
          })}
        </ol>
      )}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => onChange([...draft, newDraftPart(nextId())])}>
          Add part
        </Button>
        <Button
          variant="secondary"
          onClick={() =>
            onChange([
              ...draft,
              {
                type: 'repeat',
                id: nextId(),
                count: '4',
                parts: [
                  newDraftPart(nextId(), { kind: 'rep', amount: '400', unit: 'm' }),
                  newDraftPart(nextId(), { kind: 'recovery jog', amount: '200', unit: 'm' }),
                ],
              },
            ])
          }
        >
          Add repeat
        </Button>
      </div>
    </div>
  );
}

function RowControls({
  name,
  canUp,
  canDown,
  onMove,
  onDelete,
}: {
  name: string;
  canUp: boolean;
  canDown: boolean;
  onMove: (by: -1 | 1) => void;
  onDelete: () => void;
}) {
  const small = 'min-h-8 px-2 py-1';
  return (
    <div className="flex gap-1">
      <Button variant="secondary" className={small} disabled={!canUp} onClick={() => onMove(-1)} aria-label={`Move ${name} up`}>
        ↑
      </Button>
      <Button
        variant="secondary"
        className={small}
        disabled={!canDown}
        onClick={() => onMove(1)}
        aria-label={`Move ${name} down`}
      >
        ↓
      </Button>
      <Button variant="danger" className={small} onClick={onDelete} aria-label={`Delete ${name}`}>
        Delete
      </Button>
    </div>
  );
}

function RepeatBlock({
  repeat,
  name,
  errors,
  onChange,
  nextId,
  controls,
}: {
  repeat: DraftRepeat;
  name: string;
  errors: DraftErrors;
  onChange: (repeat: DraftRepeat) => void;
  nextId: () => string;
  controls: ReactNode;
}) {
  const parts = repeat.parts;
  const setParts = (next: DraftPart[]) => onChange({ ...repeat, parts: next });
  const countError = errors[`${repeat.id}.count`];
  return (
    <fieldset className="rounded-md border border-line-strong bg-paper/60 p-2 sm:p-3">
      <legend className="px-1 text-sm font-semibold capitalize">{name}</legend>
      <div className="flex flex-wrap items-end justify-between gap-2">
        <Mini label="Repeat count" context={name} error={countError}>
          {(control) => (
            <span className="flex items-center gap-1.5">
              <input
                {...control}
                type="number"
                inputMode="numeric"
                min={1}
                value={repeat.count}
                onChange={(e) => onChange({ ...repeat, count: e.target.value })}
                className={cn(CONTROL_CLASSES, 'w-20 px-2 py-1.5 text-sm')}
              />
              <span aria-hidden="true" className="text-sm text-ink-muted">
                × these parts
              </span>
            </span>
          )}
        </Mini>
        {controls}
      </div>
      <ol className="mt-2 flex flex-col gap-2 border-l-2 border-teal/40 pl-2 sm:pl-3">
        {parts.map((part, index) => {
          const partName = `${name} part ${index + 1}`;
          return (
            <li key={part.id}>
              <PartRow
                part={part}
                name={partName}
                errors={errors}
                onChange={(next) => setParts(parts.map((p, i) => (i === index ? next : p)))}
                controls={
                  <RowControls
                    name={partName}
                    canUp={index > 0}
                    canDown={index < parts.length - 1}
                    onMove={(by) => setParts(moveEntry(parts, index, by))}
                    onDelete={() => setParts(parts.filter((_, i) => i !== index))}
                  />
                }
              />
            </li>
          );
        })}
      </ol>
      <Button
        variant="quiet"
        className="mt-1"
        onClick={() => setParts([...parts, newDraftPart(nextId(), { kind: 'rep', amount: '400', unit: 'm' })])}
      >
        Add a part to {name}
      </Button>
    </fieldset>
  );
}

const SMALL_CONTROL = cn(CONTROL_CLASSES, 'px-2 py-1.5 text-sm');

function PartRow({
  part,
  name,
  errors,
  onChange,
  controls,
}: {
  part: DraftPart;
  name: string;
  errors: DraftErrors;
  onChange: (part: DraftPart) => void;
  controls: ReactNode;
}) {
  const set = <K extends keyof DraftPart>(key: K, value: DraftPart[K]) => onChange({ ...part, [key]: value });
  const error = (field: string) => errors[`${part.id}.${field}`];
  return (
    <div className="rounded-md border border-line bg-white p-2" role="group" aria-label={name}>
      <div className="flex flex-wrap items-end gap-2">
        <Mini label="Kind" context={name}>
          {(control) => (
            <select
              {...control}
              value={part.kind}
              onChange={(e) => set('kind', e.target.value as DraftPart['kind'])}
              className={SMALL_CONTROL}
            >
              {PART_KINDS.map((k) => (
                <option key={k} value={k}>
                  {k}
                </option>
              ))}
            </select>
          )}
        </Mini>
        <Mini label="Amount" context={name} error={error('amount')}>
          {(control) => (
            <input
              {...control}
              type="text"
              inputMode="decimal"
              value={part.amount}
              onChange={(e) => set('amount', e.target.value)}
              placeholder={part.unit === 'time' ? '45:00' : '2'}
              className={cn(SMALL_CONTROL, 'w-20')}
            />
          )}
        </Mini>
        <Mini label="Unit" context={name}>
          {(control) => (
            <select
              {...control}
              value={part.unit}
              onChange={(e) => set('unit', e.target.value as DraftAmountUnit)}
              className={SMALL_CONTROL}
            >
              {(Object.keys(UNIT_LABELS) as DraftAmountUnit[]).map((u) => (
                <option key={u} value={u}>
                  {UNIT_LABELS[u]}
                </option>
              ))}
            </select>
          )}
        </Mini>
        <Mini label="Target" context={name}>
          {(control) => (
            <select
              {...control}
              value={part.target}
              onChange={(e) => set('target', e.target.value as DraftTargetType)}
              className={SMALL_CONTROL}
            >
              {(Object.keys(TARGET_LABELS) as DraftTargetType[]).map((t) => (
                <option key={t} value={t}>
                  {TARGET_LABELS[t]}
                </option>
              ))}
            </select>
          )}
        </Mini>
        {part.target === 'pace' && (
          <>
            <Mini label="Fast" context={`${name}, pace`} error={error('paceFast')}>
              {(control) => (
                <input
                  {...control}
                  type="text"
                  value={part.paceFast}
                  onChange={(e) => set('paceFast', e.target.value)}
                  placeholder="7:05"
                  className={cn(SMALL_CONTROL, 'w-18')}
                />
              )}
            </Mini>
            <Mini label="Slow" context={`${name}, pace`} error={error('paceSlow')}>
              {(control) => (
                <input
                  {...control}
                  type="text"
                  value={part.paceSlow}
                  onChange={(e) => set('paceSlow', e.target.value)}
                  placeholder="7:15"
                  className={cn(SMALL_CONTROL, 'w-18')}
                />
              )}
            </Mini>
            <Mini label="Per" context={`${name}, pace`}>
              {(control) => (
                <select
                  {...control}
                  value={part.pacePer}
                  onChange={(e) => set('pacePer', e.target.value as DraftPart['pacePer'])}
                  className={SMALL_CONTROL}
                >
                  {PACE_PERS.map((p) => (
                    <option key={p} value={p}>
                      {PER_LABELS[p]}
                    </option>
                  ))}
                </select>
              )}
            </Mini>
          </>
        )}
        {part.target === 'relative' && (
          <>
            <Mini label="Race effort" context={name}>
              {(control) => (
                <select
                  {...control}
                  value={part.ref}
                  onChange={(e) => set('ref', e.target.value as DraftPart['ref'])}
                  className={SMALL_CONTROL}
                >
                  {RELATIVE_PACE_REFS.map((r) => (
                    <option key={r} value={r}>
                      {refLabel(r)}
                    </option>
                  ))}
                </select>
              )}
            </Mini>
            <Mini label="Offset (s)" context={name} error={error('offset')}>
              {(control) => (
                <input
                  {...control}
                  type="text"
                  inputMode="numeric"
                  value={part.offset}
                  onChange={(e) => set('offset', e.target.value)}
                  placeholder="+10"
                  className={cn(SMALL_CONTROL, 'w-16')}
                />
              )}
            </Mini>
            <Mini label="Offset per" context={name}>
              {(control) => (
                <select
                  {...control}
                  value={part.offsetPer}
                  onChange={(e) => set('offsetPer', e.target.value as DraftPart['offsetPer'])}
                  className={SMALL_CONTROL}
                >
                  <option value="mi">per mi</option>
                  <option value="km">per km</option>
                </select>
              )}
            </Mini>
          </>
        )}
        {part.target === 'heart_rate' && (
          <>
            <Mini label="Low bpm" context={name} error={error('hrLow')}>
              {(control) => (
                <input
                  {...control}
                  type="text"
                  inputMode="numeric"
                  value={part.hrLow}
                  onChange={(e) => set('hrLow', e.target.value)}
                  placeholder="140"
                  className={cn(SMALL_CONTROL, 'w-16')}
                />
              )}
            </Mini>
            <Mini label="High bpm" context={name} error={error('hrHigh')}>
              {(control) => (
                <input
                  {...control}
                  type="text"
                  inputMode="numeric"
                  value={part.hrHigh}
                  onChange={(e) => set('hrHigh', e.target.value)}
                  placeholder="150"
                  className={cn(SMALL_CONTROL, 'w-16')}
                />
              )}
            </Mini>
          </>
        )}
        <div className="ml-auto">{controls}</div>
      </div>
    </div>
  );
}

type MiniProps = {
  label: string;
  /** Read out after the label ("Kind, part 2"), so every control has a unique name. */
  context?: string;
  error?: string;
  children: (control: { id: string; 'aria-invalid'?: true; 'aria-describedby'?: string }) => ReactNode;
};

/** A small labelled control for the builder's dense rows; its error is shown under it and read with it. */
function Mini({ label, context, error, children }: MiniProps) {
  const id = useId();
  const errorId = `${id}-error`;
  return (
    <div className="flex max-w-full flex-col gap-0.5">
      <label htmlFor={id} className="text-xs font-semibold text-ink-muted">
        {label}
        {context && <span className="sr-only">, {context}</span>}
      </label>
      {children({ id, 'aria-invalid': error ? true : undefined, 'aria-describedby': error ? errorId : undefined })}
      {error && (
        <p id={errorId} className="max-w-56 text-xs font-semibold text-tartan">
          {error}
        </p>
      )}
    </div>
  );
}
