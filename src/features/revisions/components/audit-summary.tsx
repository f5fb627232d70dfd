import type { AuditReportDto } from '../../../../shared/api/revisions.js';
import { cn } from '../../../components/ui/cn.js';

const KIND_LABELS: Record<string, string> = {
  corner: 'Corner',
  'mortise-and-tenon': 'Mortise and tenon',
  'cross-lap': 'Cross-lap',
  'through-slot': 'Through-slot',
  'locked-crossing': 'Locked crossing',
};

function Figure({ label, value, note, tone }: { label: string; value: string | number; note?: string; tone?: 'bad' }) {
  return (
    <div className={cn('rounded-md border bg-paper/50 px-3 py-2', tone === 'bad' ? 'border-signal-error' : 'border-rule')}>
      <dt className="font-mono text-xs uppercase tracking-wide text-ink-soft">{label}</dt>
      <dd className={cn('text-2xl font-semibold tabular-nums', tone === 'bad' && 'text-signal-error')}>{value}</dd>
      {note ? <dd className="text-xs text-ink-soft">{note}</dd> : null}
    </div>
  );
}

/** The audit's figures: pieces, templates, joints by kind, components and the sheet estimate. */
export function AuditSummary({ report }: { report: AuditReportDto }) {
  const errors = report.findings.filter((f) => f.severity === 'error').length;
  const warnings = report.findings.filter((f) => f.severity === 'warning').length;
  const kinds = Object.entries(report.summary.byKind);
  return (
    <div className="space-y-5">
      <p className={cn('flex items-center gap-2 text-base font-medium', report.ok ? 'text-signal-ok' : 'text-signal-error')}>
        <span aria-hidden="true" className="font-mono text-lg">
          {report.ok ? '✓' : '✕'}
        </span>
        <span className="text-ink">
          {report.ok
            ? `No errors: the design passes the brief${warnings ? ` (${warnings} ${warnings === 1 ? 'warning' : 'warnings'} to look at)` : ''}.`
            : `${errors} ${errors === 1 ? 'error' : 'errors'} to fix before the design can be cut${warnings ? `, and ${warnings} ${warnings === 1 ? 'warning' : 'warnings'}` : ''}.`}
        </span>
      </p>
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6">
        <Figure label="Group" value={report.group} note={`order ${report.order}`} />
        <Figure label="Pieces" value={report.pieces} />
        <Figure label="Templates" value={report.templates} note="distinct cutting shapes" />
        <Figure label="Joints" value={report.summary.joints} note={`${report.summary.orthogonal} square, ${report.summary.nonOrthogonal} not`} tone={report.summary.nonOrthogonal ? 'bad' : undefined} />
        <Figure label="Components" value={report.components} note={report.components === 1 ? 'one connected whole' : 'must be 1'} tone={report.components > 1 ? 'bad' : undefined} />
        <Figure
          label="Sheets"
          value={report.sheets ? report.sheets.count : '—'}
          note={report.sheets ? `${Math.round(report.sheets.utilization * 100)} % used` : 'no sheet size'}
        />
      </dl>
      <div>
        <h3 className="mb-2 text-sm font-semibold">Joints by kind</h3>
        <table className="text-sm">
          <caption className="sr-only">Joints by kind</caption>
          <tbody>
            {kinds.map(([kind, count]) => (
              <tr key={kind} className="border-b border-rule/60 last:border-b-0">
                <th scope="row" className="py-1 pr-6 text-left font-normal">
                  {KIND_LABELS[kind] ?? kind}
                </th>
                <td className={cn('py-1 text-right font-mono tabular-nums', kind === 'locked-crossing' && count > 0 && 'font-semibold text-signal-error')}>{count}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

/** The nesting's estimate as figures and one small drawing per sheet, filled to the share used. */
export function SheetEstimate({ sheets }: { sheets: NonNullable<AuditReportDto['sheets']> }) {
  const [w, h] = sheets.size;
  const shown = Math.min(sheets.count, 12);
  const used = Math.max(0, Math.min(1, sheets.utilization));
  const scale = 64 / Math.max(w, h);
  return (
    <div className="space-y-3">
      <p className="text-sm">
        {sheets.count} {sheets.count === 1 ? 'sheet' : 'sheets'} of {w} × {h} mm, {Math.round(used * 100)} % of {sheets.count === 1 ? 'its' : 'their'} area used by pieces.
      </p>
      <div className="flex flex-wrap gap-2" aria-hidden="true">
        {Array.from({ length: shown }, (_, i) => (
          <svg key={i} width={w * scale + 2} height={h * scale + 2} className="text-accent">
            <rect x="1" y="1" width={w * scale} height={h * scale} fill="#fbf8f1" stroke="#b3a890" />
            <rect x="1" y={1 + h * scale * (1 - used)} width={w * scale} height={h * scale * used} fill="currentColor" opacity="0.25" />
          </svg>
        ))}
        {sheets.count > shown ? <span className="self-end font-mono text-xs text-ink-soft">+{sheets.count - shown}</span> : null}
      </div>
    </div>
  );
}
