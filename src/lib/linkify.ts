export type TextPart = { kind: 'text'; text: string } | { kind: 'link'; text: string; href: string };

const URL_PATTERN = /\bhttps?:\/\/[^\s<>"'`]+/gi;
const TRAILING = /[.,;:!?)\]}>'"]+$/;

/**
 * Splits plain text into text and http(s) links. Trailing punctuation (a sentence's full stop, a
 * closing bracket) stays text; other schemes (javascript:, data:) are never links.
 */
export function splitLinks(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index ?? 0;
    let url = match[0];
    const trailing = url.match(TRAILING)?.[0] ?? '';
    // Keep a closing bracket that belongs to the URL itself, e.g. .../page_(detail)
    if (trailing && !(trailing.startsWith(')') && url.slice(0, -trailing.length).includes('('))) {
      url = url.slice(0, -trailing.length);
    }
    if (start > last) parts.push({ kind: 'text', text: text.slice(last, start) });
    parts.push({ kind: 'link', text: url, href: url });
    last = start + url.length;
  }
  if (last < text.length) parts.push({ kind: 'text', text: text.slice(last) });
  return parts;
}
