import type { z } from 'zod';
import type { FieldIssue } from './errors.ts';

/** Turns zod issues into `{field, message}` pairs a form can place beside its fields; `field` is the dotted path. */
export function toFieldIssues(error: z.ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({
    field: issue.path.join('.') || (issue.code === 'unrecognized_keys' ? issue.keys.join(', ') : ''),
    message: issue.code === 'unrecognized_keys' ? `Unknown field: ${issue.keys.join(', ')}.` : issue.message,
  }));
}

/** Field name → first message for that field; issues without a field are left out (the form shows them as a whole). */
export function toFieldErrors(issues: readonly FieldIssue[]): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const { field, message } of issues) {
    if (field && !(field in errors)) errors[field] = message;
  }
  return errors;
}
