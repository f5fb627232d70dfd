import { useId, useState } from 'react';

const FIXED = [
  { name: 'T', label: 'T — tetrahedral (order 12)' },
  { name: 'O', label: 'O — octahedral (order 24)' },
  { name: 'I', label: 'I — icosahedral (order 60)' },
] as const;

function ordersOf(groups: readonly string[], letter: 'C' | 'D'): number[] {
  return groups
    .map((g) => new RegExp(`^${letter}(\\d+)$`).exec(g))
    .filter((m): m is RegExpExecArray => m !== null)
    .map((m) => Number(m[1]));
}

/** "3, 5 8" → [3, 5, 8]; null when something is not a whole number at least `min`. */
export function parseOrders(text: string, min: number): number[] | null {
  const parts = text.split(/[\s,;]+/).filter(Boolean);
  const out: number[] = [];
  for (const p of parts) {
    if (!/^\d+$/.test(p)) return null;
    const n = Number(p);
    if (n < min || n > 1000) return null;
    if (!out.includes(n)) out.push(n);
  }
  return out;
}

function CyclicRow({
  letter,
  min,
  label,
  groups,
  onChange,
}: {
  letter: 'C' | 'D';
  min: number;
  label: string;
  groups: string[];
  onChange: (groups: string[]) => void;
}) {
  const id = useId();
  const orders = ordersOf(groups, letter);
  const [text, setText] = useState(orders.join(', ') || (letter === 'C' ? '5' : '4'));
  const [problem, setProblem] = useState<string | null>(null);
  const on = orders.length > 0;
  const others = groups.filter((g) => !new RegExp(`^${letter}\\d+$`).test(g));

  const apply = (checked: boolean, value: string) => {
    if (!checked) {
      setProblem(null);
      onChange(others);
      return;
    }
    const parsed = parseOrders(value, min);
    if (!parsed || parsed.length === 0) {
      setProblem(`Give n as whole numbers of at least ${min}, separated by commas`);
      onChange(others);
      return;
    }
    setProblem(null);
    onChange([...others, ...parsed.map((n) => `${letter}${n}`)]);
  };

  return (
    <div className="space-y-1">
      <div className="flex flex-wrap items-center gap-2">
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" className="size-4 accent-accent" checked={on} onChange={(e) => apply(e.target.checked, text)} />
          {label}
        </label>
        <label htmlFor={id} className="text-sm text-ink-soft">
          n =
        </label>
        <input
          id={id}
          aria-label={`${letter}<n>: values of n`}
          value={text}
          onChange={(e) => {
            setText(e.target.value);
            if (on) apply(true, e.target.value);
          }}
          className="h-8 w-28 rounded-md border border-rule-strong bg-paper-raised px-2 font-mono text-sm focus-visible:outline-2 focus-visible:outline-accent"
        />
      </div>
      {problem ? <p className="text-sm text-signal-error">{problem}</p> : null}
    </div>
  );
}

/** Which rotation groups a design may use: T, O, I, and cyclic or dihedral groups of chosen orders. */
export function GroupPicker({ value, onChange, error }: { value: string[]; onChange: (groups: string[]) => void; error?: string }) {
  const toggle = (name: string, checked: boolean) => onChange(checked ? [...value.filter((g) => g !== name), name] : value.filter((g) => g !== name));
  return (
    <fieldset className="space-y-2" aria-describedby={error ? 'allowed-groups-error' : undefined}>
      <legend className="text-sm font-medium">Allowed symmetry groups</legend>
      <div className="flex flex-wrap gap-x-5 gap-y-2">
        {FIXED.map((g) => (
          <label key={g.name} className="inline-flex items-center gap-2 text-sm">
            <input type="checkbox" className="size-4 accent-accent" checked={value.includes(g.name)} onChange={(e) => toggle(g.name, e.target.checked)} />
            {g.label}
          </label>
        ))}
      </div>
      <CyclicRow letter="C" min={1} label="C<n> — cyclic" groups={value} onChange={onChange} />
      <CyclicRow letter="D" min={2} label="D<n> — dihedral" groups={value} onChange={onChange} />
      {error ? (
        <p id="allowed-groups-error" className="text-sm text-signal-error">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
