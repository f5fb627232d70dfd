import { useId } from 'react';
import { PIN_CATEGORIES, PIN_CATEGORY_LABELS, type Pin, type PinCategory } from '../../../../shared/api/critique.js';
import { cn } from '../../../components/ui/cn.js';
import { OutdatedBadge, PinNumber, PinStateBadge } from './pin-badges.js';
import { type PinFilters, type PinStateFilter, filterPins, firstWords, pinLabel, plural, replyCount } from './pin-words.js';

const STATE_FILTERS: readonly { value: PinStateFilter; label: string }[] = [
  { value: 'open', label: 'Open' },
  { value: 'resolved', label: 'Resolved' },
  { value: 'all', label: 'All' },
];

export interface PinListProps {
  pins: readonly Pin[];
  filters: PinFilters;
  onFiltersChange(filters: PinFilters): void;
  selectedId: number | null;
  onSelect(pin: Pin): void;
  /** Shown when the revision has no pins at all. */
  emptyMessage: string;
}

/**
 * The pins of a revision: number (in the marker's shape), category, state, piece, the first words
 * of the first comment and the number of replies. Filters by state and category; a pin pressed
 * here is the one selected on the model.
 */
export function PinList({ pins, filters, onFiltersChange, selectedId, onSelect, emptyMessage }: PinListProps) {
  const categoryId = useId();
  const stateName = useId();
  const shown = filterPins(pins, filters);
  const open = pins.filter((p) => p.state === 'open').length;
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-x-4 gap-y-2 text-sm">
        <fieldset className="flex items-center gap-1">
          <legend className="sr-only">Show pins</legend>
          {STATE_FILTERS.map((f) => (
            <label
              key={f.value}
              className={cn(
                'cursor-pointer rounded-md border px-2 py-1 text-xs has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent',
                filters.state === f.value ? 'border-accent bg-accent-wash text-accent-strong' : 'border-rule-strong bg-paper-raised',
              )}
            >
              <input
                type="radio"
                name={stateName}
                value={f.value}
                checked={filters.state === f.value}
                onChange={() => onFiltersChange({ ...filters, state: f.value })}
                className="sr-only"
              />
              {f.label}
              {f.value === 'open' ? ` (${open})` : f.value === 'resolved' ? ` (${pins.length - open})` : ` (${pins.length})`}
            </label>
          ))}
        </fieldset>
        <label htmlFor={categoryId} className="flex items-center gap-2">
          <span>Category</span>
          <select
            id={categoryId}
            value={filters.category}
            onChange={(e) => onFiltersChange({ ...filters, category: e.target.value as PinCategory | '' })}
            className="h-8 rounded-md border border-rule-strong bg-paper-raised py-1 pl-2 pr-1 text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent"
          >
            <option value="">All categories</option>
            {PIN_CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {PIN_CATEGORY_LABELS[c]}
              </option>
            ))}
          </select>
        </label>
      </div>
      {pins.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule-strong px-3 py-6 text-center text-sm text-ink-soft">{emptyMessage}</p>
      ) : shown.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule-strong px-3 py-4 text-center text-sm text-ink-soft">No pins match the filters.</p>
      ) : (
        <ul aria-label="Pins" className="max-h-[22rem] space-y-1.5 overflow-auto p-0.5" data-testid="pin-list">
          {shown.map((pin) => {
            const selected = pin.id === selectedId;
            const replies = replyCount(pin);
            return (
              <li key={pin.id}>
                <button
                  type="button"
                  aria-pressed={selected}
                  aria-label={`${pinLabel(pin)}. ${plural(replies, 'reply', 'replies')}.`}
                  data-pin-id={pin.id}
                  onClick={() => onSelect(pin)}
                  className={cn(
                    'flex w-full items-start gap-2 rounded-md border px-2 py-2 text-left text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent',
                    selected ? 'border-accent bg-accent-wash' : 'border-rule bg-paper-raised hover:border-accent',
                    pin.id < 0 && 'opacity-70',
                  )}
                >
                  <PinNumber number={pin.number} state={pin.state} />
                  <span className="min-w-0 flex-1 space-y-1">
                    <span className="flex flex-wrap items-center gap-1.5">
                      <span className="font-medium">{PIN_CATEGORY_LABELS[pin.category]}</span>
                      <PinStateBadge state={pin.state} />
                      {pin.outdated ? <OutdatedBadge /> : null}
                      <span className="font-mono text-xs text-ink-soft">
                        {pin.anchor.piece}
                        {pin.scope === 'orbit' ? ' + orbit' : ''}
                      </span>
                    </span>
                    <span className="block truncate text-ink-soft">{firstWords(pin.comments[0]?.body ?? '')}</span>
                    <span className="block font-mono text-xs text-ink-soft">
                      {pin.id < 0 ? 'saving…' : plural(replies, 'reply', 'replies')}
                    </span>
                  </span>
                </button>
              </li>
            );
          })}
        </ul>
      )}
    </div>
  );
}
