// Form validation with the same zod schemas the server validates with. Messages are shown under the
// field they belong to: the field's label followed by the schema's message ("Supply voltage must be
// at least 100 V"). Field errors the server names in `details` land under the same fields.
import { ref } from 'vue';
import type { z } from 'zod';
import type { ApiError } from 'src/api/client';

type Issue = z.core.$ZodIssue;

/** Messages for the cases the schemas leave to zod's defaults (an empty number field, mostly). */
const blankAware: z.core.$ZodErrorMap = (issue) => {
  if (issue.code === 'invalid_type') {
    const input = issue.input;
    if (input === undefined || input === null || input === '') return 'is required';
    return issue.expected === 'number' ? 'must be a number' : `must be a ${issue.expected}`;
  }
  return undefined;
};

/** `timeOfUse.0.name` from a zod path. */
export function pathKey(path: readonly PropertyKey[]): string {
  return path.map(String).join('.');
}

function withLabel(label: string | undefined, message: string): string {
  if (!label) return message.charAt(0).toUpperCase() + message.slice(1);
  return /^[a-z]/.test(message) ? `${label} ${message}` : `${label}: ${message}`;
}

/**
 * The label for a path: the path itself (`timeOfUse.0.name`), then without list indexes
 * (`timeOfUse.name`), then its last name (`name`).
 */
export function labelFor(key: string, labels: Record<string, string>): string | undefined {
  const named = key.split('.').filter((part) => !/^\d+$/.test(part));
  return labels[key] ?? labels[named.join('.')] ?? labels[named.at(-1) ?? ''];
}

/** One message per field, the first issue winning. */
export function issuesToErrors(issues: readonly Issue[], labels: Record<string, string> = {}): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const issue of issues) {
    const key = pathKey(issue.path);
    if (key in errors) continue;
    errors[key] = withLabel(labelFor(key, labels), issue.message);
  }
  return errors;
}

export function useZodForm<Schema extends z.ZodType>(schema: Schema, labels: Record<string, string> = {}) {
  const errors = ref<Record<string, string>>({});

  /** The parsed value, or null with `errors` filled in. */
  function validate(value: unknown): z.output<Schema> | null {
    const result = schema.safeParse(value, { error: blankAware });
    if (result.success) {
      errors.value = {};
      return result.data;
    }
    errors.value = issuesToErrors(result.error.issues, labels);
    return null;
  }

  function error(path: string): string | undefined {
    return errors.value[path];
  }

  function hasError(path: string): boolean {
    return path in errors.value;
  }

  /** Clear one field's message (as the user edits it) or all of them. */
  function clear(path?: string): void {
    if (path === undefined) errors.value = {};
    else if (path in errors.value) {
      const { [path]: _removed, ...rest } = errors.value;
      errors.value = rest;
    }
  }

  /** Show the fields a server error names; true when it named any. */
  function applyServerError(apiError: ApiError): boolean {
    const fields = apiError.fieldMessages;
    if (fields.length === 0) return false;
    const next: Record<string, string> = {};
    for (const { field, message } of fields) next[field] = withLabel(labelFor(field, labels), message);
    errors.value = next;
    return true;
  }

  return { errors, validate, error, hasError, clear, applyServerError };
}
