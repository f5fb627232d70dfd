import { PIN_CATEGORY_LABELS, type Pin, type PinCategory, type PinState } from '../../../../shared/api/critique.js';

export type PinStateFilter = PinState | 'all';

export interface PinFilters {
  readonly state: PinStateFilter;
  /** A category, or '' for every category. */
  readonly category: PinCategory | '';
}

export const ALL_PINS: PinFilters = { state: 'all', category: '' };

/** The pins that pass the list's filters, in the order given. */
export function filterPins(pins: readonly Pin[], filters: PinFilters): Pin[] {
  return pins.filter((p) => (filters.state === 'all' || p.state === filters.state) && (filters.category === '' || p.category === filters.category));
}

/**
 * The first words of a comment as plain text: markdown marks, link targets and raw tags dropped,
 * cut after `max` words with an ellipsis.
 */
export function firstWords(markdown: string, max = 12): string {
  const text = markdown
    .replace(/```[\s\S]*?```/g, ' ')
    .replace(/<[^>]*>/g, ' ')
    .replace(/!?\[([^\]]*)\]\((?:[^()]|\([^()]*\))*\)/g, '$1')
    .replace(/[`*_#>~|]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim();
  const words = text.split(' ').filter(Boolean);
  return words.length > max ? `${words.slice(0, max).join(' ')}…` : words.join(' ');
}

/** Replies in a thread: every comment after the pin's first. */
export function replyCount(pin: Pin): number {
  return Math.max(0, pin.comments.length - 1);
}

/** How a pin is announced: "Pin 3: open, Structure, on rib-03". */
export function pinLabel(pin: Pin): string {
  return `Pin ${pin.number}: ${pin.state}${pin.outdated ? ', outdated' : ''}, ${PIN_CATEGORY_LABELS[pin.category]}, on ${pin.anchor.piece}${pin.scope === 'orbit' ? ' and its orbit' : ''}`;
}

export function plural(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * What others added between two fetched lists, in words ("1 new pin and 2 new replies"), or
 * null when nothing: pins and comments by `me` and optimistic entries (negative ids) are left
 * out, since the person saw them appear.
 */
export function newActivity(before: readonly Pin[], after: readonly Pin[], me: number | null): string | null {
  const old = new Map(before.map((p) => [p.id, new Set(p.comments.map((c) => c.id))]));
  let pins = 0;
  let replies = 0;
  for (const p of after) {
    if (p.id < 0) continue;
    const seen = old.get(p.id);
    if (!seen) {
      if (p.author.id !== me) pins++;
      continue;
    }
    for (const c of p.comments) if (c.id > 0 && !seen.has(c.id) && c.author.id !== me) replies++;
  }
  const parts = [pins ? plural(pins, 'new pin', 'new pins') : '', replies ? plural(replies, 'new reply', 'new replies') : ''].filter(Boolean);
  return parts.length ? parts.join(' and ') : null;
}
