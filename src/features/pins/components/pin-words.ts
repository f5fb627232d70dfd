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
