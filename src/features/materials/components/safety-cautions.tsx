import { SAFETY_CAUTIONS } from '../../../../shared/api/materials.js';
import { cn } from '../../../components/ui/cn.js';

/**
 * The usual laser-cutting cautions, shown wherever a material is chosen. They defer to local
 * codes and the maker space's own rules.
 */
export function SafetyCautions({ className, compact = false }: { className?: string; compact?: boolean }) {
  return (
    <aside
      aria-labelledby="safety-cautions-heading"
      className={cn('rounded-lg border-2 border-dashed border-signal-error/70 bg-signal-error-wash/40 px-4 py-3', className)}
    >
      <h2 id="safety-cautions-heading" className="flex items-center gap-2 text-sm font-semibold text-signal-error">
        <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4">
          <path d="M8 1.5 15 14H1z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
          <path d="M8 6v4M8 11.6v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        Safety at the laser
      </h2>
      <ul className={cn('mt-2 list-disc space-y-1 pl-5 text-ink', compact ? 'text-xs' : 'text-sm')}>
        {SAFETY_CAUTIONS.map((c) => (
          <li key={c.id}>{c.text}</li>
        ))}
      </ul>
    </aside>
  );
}
