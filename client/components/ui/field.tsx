import { useId, type ComponentProps, type ReactNode } from 'react';
import { cn } from '../../lib/cn.ts';

/** Border and colours of text inputs and selects; size and spacing are up to the caller. */
export const CONTROL_CLASSES =
  'rounded-md border border-line-strong bg-white text-ink placeholder:text-ink-muted aria-[invalid=true]:border-tartan';
const FIELD_CONTROL_CLASSES = cn(CONTROL_CLASSES, 'w-full px-3 py-2 text-base');

type FieldShellProps = {
  label: string;
  hint?: ReactNode;
  error?: string;
  className?: string;
  children: (control: { id: string; 'aria-describedby'?: string; 'aria-invalid'?: true }) => ReactNode;
};

/** Label, control, hint and error wired together: the error and hint are read out with the control. */
export function FieldShell({ label, hint, error, className, children }: FieldShellProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint && hintId, error && errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cn('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      {children({ id, 'aria-describedby': describedBy, 'aria-invalid': error ? true : undefined })}
      {hint && (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-sm font-semibold text-tartan">
          {error}
        </p>
      )}
    </div>
  );
}

type TextFieldProps = Omit<ComponentProps<'input'>, 'id'> & { label: string; hint?: ReactNode; error?: string };

export function TextField({ label, hint, error, className, ...input }: TextFieldProps) {
  return (
    <FieldShell label={label} hint={hint} error={error} className={className}>
      {(control) => <input className={FIELD_CONTROL_CLASSES} {...control} {...input} />}
    </FieldShell>
  );
}

type SelectFieldProps = Omit<ComponentProps<'select'>, 'id'> & { label: string; hint?: ReactNode; error?: string };

export function SelectField({ label, hint, error, className, children, ...select }: SelectFieldProps) {
  return (
    <FieldShell label={label} hint={hint} error={error} className={className}>
      {(control) => (
        <select className={FIELD_CONTROL_CLASSES} {...control} {...select}>
          {children}
        </select>
      )}
    </FieldShell>
  );
}
