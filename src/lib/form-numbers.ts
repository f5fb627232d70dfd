/**
 * Number inputs in react-hook-form: an empty box is "no value" (undefined or null), never NaN or 0,
 * so the schema's own message ("Enter a number") reaches the field instead of a type error.
 */
export function toNumber(value: unknown): number | undefined {
  if (typeof value === 'number') return Number.isFinite(value) ? value : undefined;
  if (typeof value !== 'string') return undefined;
  const text = value.trim().replace(',', '.');
  if (text === '') return undefined;
  const n = Number(text);
  return Number.isFinite(n) ? n : Number.NaN;
}

export function toNumberOrNull(value: unknown): number | null {
  const n = toNumber(value);
  return n === undefined ? null : n;
}

/** Register options for a required number box. */
export const numberField = { setValueAs: toNumber } as const;
/** Register options for a number box that may stay empty (null). */
export const nullableNumberField = { setValueAs: toNumberOrNull } as const;

interface IssueLike {
  code?: string;
  expected?: string;
  input?: unknown;
}

/**
 * Error map for zodResolver: the shared schemas carry messages for rules, but a missing or
 * unreadable number only gets zod's generic text; this says what to do instead. Messages the
 * schema sets itself win over these.
 */
export function formErrorMap(issue: IssueLike): string | undefined {
  if (issue.code !== 'invalid_type') return undefined;
  if (issue.expected === 'number' || issue.expected === 'int') {
    return typeof issue.input === 'number' && Number.isNaN(issue.input) ? 'Enter a number, such as 3 or 0.15' : 'Enter a number';
  }
  if (issue.expected === 'string') return 'Enter a value';
  if (issue.expected === 'array' || issue.expected === 'tuple') return 'Fill in every value';
  return undefined;
}
