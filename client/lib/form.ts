import { useState, type FormEvent } from 'react';
import type { UseMutationResult } from '@tanstack/react-query';
import type { z } from 'zod';
import { toFieldErrors, toFieldIssues } from '../../shared/api/field-issues.ts';
import { isApiError } from './api-client.ts';

export type FieldErrors = Record<string, string>;

type SchemaFormOptions<S extends z.ZodType, R> = {
  schema: S;
  mutation: UseMutationResult<R, Error, z.output<S>>;
  /** Turns the submitted form into the schema's input; empty text fields usually become undefined or null. */
  readValues: (data: FormData) => unknown;
  onSuccess?: (result: R) => void;
};

/**
 * Validates a submitted form with a shared zod schema before sending it, and places the server's
 * field problems beside the same fields. Moves focus to the first field that needs attention.
 */
export function useSchemaForm<S extends z.ZodType, R>({ schema, mutation, readValues, onSuccess }: SchemaFormOptions<S, R>) {
  const [clientErrors, setClientErrors] = useState<FieldErrors | null>(null);
  const serverIssues = isApiError(mutation.error) ? toFieldErrors(mutation.error.fieldIssues) : {};
  const hasServerIssues = Object.keys(serverIssues).length > 0;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const result = schema.safeParse(readValues(new FormData(form)));
    if (!result.success) {
      const errors = toFieldErrors(toFieldIssues(result.error));
      mutation.reset();
      setClientErrors(errors);
      focusFirstInvalid(form, Object.keys(errors));
      return;
    }
    setClientErrors(null);
    mutation.mutate(result.data, {
      onSuccess,
      onError: (error) => {
        if (isApiError(error))
          focusFirstInvalid(
            form,
            error.fieldIssues.map((issue) => issue.field),
          );
      },
    });
  }

  return {
    onSubmit,
    fieldErrors: clientErrors ?? serverIssues,
    formError:
      mutation.error && (hasServerIssues ? 'Some fields need attention: see the messages beside them.' : mutation.error.message),
  };
}

/** Focuses the first control, in page order, whose name has a problem. */
function focusFirstInvalid(form: HTMLFormElement, names: string[]) {
  const control = Array.from(form.elements).find((element): element is HTMLInputElement =>
    names.includes((element as HTMLInputElement).name),
  );
  control?.focus();
}

/** A text field's value, or undefined when it is missing or blank. */
export function readText(data: FormData, name: string): string | undefined {
  const value = data.get(name);
  return typeof value === 'string' && value.trim() !== '' ? value : undefined;
}
