import { useId, type Ref } from 'react';
import type { ShorthandResult } from '../../../../shared/plans/shorthand.ts';
import { CONTROL_CLASSES } from '../../../components/ui/field.tsx';
import { cn } from '../../../lib/cn.ts';

type ShorthandFieldProps = {
  value: string;
  onChange: (text: string) => void;
  /** `parseShorthand(value)`, done by the caller on every keystroke. */
  result: ShorthandResult;
  inputRef?: Ref<HTMLInputElement>;
  /** The form's name for the field (the API's). */
  name?: string;
  /** A problem found beyond the reading (the server's answer, a length limit), shown under the field. */
  problem?: string;
};

export const SHORTHAND_EXAMPLE = '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down';

/**
 * The one-line shorthand with feedback as you type: when it cannot be read, the sentence from the
 * parser and the text again with the character at fault marked (a caret under the end when
 * something is missing there).
 */
export function ShorthandField({ value, onChange, result, inputRef, name, problem }: ShorthandFieldProps) {
  const id = useId();
  const error = !result.ok && value.trim() !== '' ? result.error : null;
  const problemId = `${id}-problem`;
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        Session in shorthand
      </label>
      <input
        ref={inputRef}
        id={id}
        name={name}
        type="text"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        spellCheck={false}
        autoComplete="off"
        placeholder={SHORTHAND_EXAMPLE}
        aria-invalid={error || problem ? true : undefined}
        aria-describedby={[error && errorId, problem && problemId, hintId].filter(Boolean).join(' ')}
        className={cn(CONTROL_CLASSES, 'w-full px-3 py-2 font-mono text-sm')}
      />
      {error ? (
        <div id={errorId} className="flex flex-col gap-1">
          <p className="text-sm font-semibold text-tartan" role="status">
            {error.message}
          </p>
          <p className="text-sm text-ink-muted">
            At character {error.position + 1}, expected {error.expected}.
          </p>
          <MarkedText text={value} position={error.position} />
        </div>
      ) : null}
      {problem && !error && (
        <p id={problemId} className="text-sm font-semibold text-tartan">
          {problem}
        </p>
      )}
      <p id={hintId} className="text-sm text-ink-muted">
        Parts separated by commas: an amount (2 mi, 800 m, 45 min), a kind (warm-up, easy, steady, tempo, goal pace, rep, jog,
        cool-down, strides) and a target after @ (7:05/mi, 2:55-3:00 for the rep's distance, a race effort such as MP, HMP, 10K or
        5K, goal, 150-160 bpm). Repeats: <code>6 x 800 m w/ 400 m jog</code>.
      </p>
    </div>
  );
}

/** The text with the character at `position` highlighted; at the end, a caret marks where something is missing. */
function MarkedText({ text, position }: { text: string; position: number }) {
  const at = Math.min(position, text.length);
  const before = text.slice(0, at);
  const marked = text.slice(at, at + 1);
  const after = text.slice(at + 1);
  return (
    <p
      aria-hidden="true"
      className="overflow-x-auto rounded-md border border-line bg-paper px-3 py-1.5 font-mono text-sm whitespace-pre"
    >
      {before}
      {marked ? (
        <mark className="rounded-xs bg-tartan px-px text-white">{marked}</mark>
      ) : (
        <mark className="bg-transparent font-bold text-tartan">‸</mark>
      )}
      {after}
    </p>
  );
}
