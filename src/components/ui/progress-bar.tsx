import { cn } from './cn.js';

/**
 * A labelled progress bar. `value` is 0–1, or null while the size is unknown (the bar then
 * shows movement without a figure). The figure is also written out, so it is never colour alone.
 */
export function ProgressBar({ label, value, className }: { label: string; value: number | null; className?: string }) {
  const percent = value === null ? null : Math.round(Math.max(0, Math.min(1, value)) * 100);
  return (
    <div className={cn('space-y-1', className)}>
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <span className="font-medium">{label}</span>
        <span className="font-mono text-xs text-ink-soft">{percent === null ? 'sending…' : `${percent} %`}</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent ?? undefined}
        aria-valuetext={percent === null ? 'Sending' : `${percent} percent`}
        className="h-2.5 w-full overflow-hidden rounded-full border border-rule-strong bg-paper-sunk"
      >
        <div
          className={cn('h-full bg-accent transition-[width] duration-150', percent === null && 'w-1/3 animate-pulse')}
          style={percent === null ? undefined : { width: `${percent}%` }}
        />
      </div>
    </div>
  );
}
