import { useState, type FormEvent } from 'react';
import type { z } from 'zod';
import { toFieldErrors, toFieldIssues } from '../../../../shared/api/field-issues.ts';

/**
 * A calculator form checked with a shared zod schema: on a valid submit, `onValid` gets the parsed value;
 * otherwise each field gets its message and focus moves to the first field that needs attention.
 */
export function useToolForm<S extends z.ZodType>(
  schema: S,
  readValues: (data: FormData) => unknown,
  onValid: (value: z.output<S>) => void,
  /** Called when a submit is refused, so the page can clear results that no longer match the form. */
  onInvalid?: () => void,
) {
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const result = schema.safeParse(readValues(new FormData(form)));
    if (!result.success) {
      const errors = toFieldErrors(toFieldIssues(result.error));
      setFieldErrors(errors);
      onInvalid?.();
      const names = Object.keys(errors);
      const first = Array.from(form.elements).find((el): el is HTMLInputElement => names.includes((el as HTMLInputElement).name));
      first?.focus();
      return;
    }
    setFieldErrors({});
    onValid(result.data);
  }

  return { onSubmit, fieldErrors };
}
