/**
 * Puts a server's `fields` errors onto the fields of a react-hook-form form.
 * The server names fields by path (`body.email`); the form knows them as `email`.
 */
import type { FieldErrors } from './api-client.js';

export function fieldNameFromPath(path: string): string {
  // `constraints.sheet[0]` (server) and `constraints.sheet.0` (react-hook-form) name one field.
  return path.replace(/^(body|query|params)\./, '').replace(/\[(\d+)\]/g, '.$1');
}

/**
 * Calls `setError` for every server field the form has and returns the messages it could not
 * place (so the caller can show them in the form's status line instead of losing them).
 */
export function applyFieldErrors<Name extends string>(
  fields: FieldErrors,
  formFields: readonly Name[] | ((name: string) => boolean),
  setError: (name: Name, error: { type: string; message: string }) => void,
): string[] {
  const unplaced: string[] = [];
  const known = typeof formFields === 'function' ? formFields : (name: string) => (formFields as readonly string[]).includes(name);
  for (const [path, message] of Object.entries(fields)) {
    const name = fieldNameFromPath(path);
    if (known(name)) setError(name as Name, { type: 'server', message });
    else unplaced.push(name ? `${name}: ${message}` : message);
  }
  return unplaced;
}
