/** Reads a numeric id from the address, or answers 404 in words the person can act on. */
export function parseIdParam(raw: string | undefined, what: string, example: string): number {
  const id = Number(raw);
  if (!Number.isInteger(id) || id <= 0) {
    throw new Response(`A ${what} address ends in its number, such as ${example}.`, { status: 404, statusText: 'Not Found' });
  }
  return id;
}
