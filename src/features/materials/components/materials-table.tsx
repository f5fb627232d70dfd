import type { ColumnDef } from '@tanstack/react-table';
import type { Material } from '../../../../shared/api/materials.js';
import { Button } from '../../../components/ui/button.js';
import { DataTable } from '../../../components/ui/data-table.js';

export function formatSheetSizes(sizes: readonly (readonly [number, number])[]): string {
  return sizes.length ? sizes.map(([w, h]) => `${w} × ${h}`).join(', ') : '—';
}

/** Prohibited materials carry a crossed mark and the word, never colour alone. */
export function ProhibitedMark({ reason }: { reason: string | null }) {
  return (
    <span className="inline-flex items-start gap-1.5 text-signal-error">
      <svg aria-hidden="true" viewBox="0 0 12 12" className="mt-0.5 size-3 shrink-0">
        <circle cx="6" cy="6" r="4.6" fill="none" stroke="currentColor" strokeWidth="1.4" />
        <path d="M2.8 9.2 9.2 2.8" stroke="currentColor" strokeWidth="1.4" />
      </svg>
      <span>
        <span className="font-semibold">Prohibited</span>
        {reason ? <span className="block max-w-80 text-xs text-ink">{reason}</span> : null}
      </span>
    </span>
  );
}

export function MaterialsTable({ materials, onEdit }: { materials: Material[]; onEdit?: (material: Material) => void }) {
  const columns: ColumnDef<Material, any>[] = [
    { accessorKey: 'name', header: 'Name', cell: ({ row }) => <span className="font-medium">{row.original.name}</span> },
    { accessorKey: 'thickness', header: 'Thickness', enableGlobalFilter: false, cell: ({ getValue }) => <span className="whitespace-nowrap font-mono">{getValue()} mm</span> },
    { accessorKey: 'kerf', header: 'Kerf', enableGlobalFilter: false, cell: ({ getValue }) => <span className="whitespace-nowrap font-mono">{getValue()} mm</span> },
    {
      accessorKey: 'cuttingSpeed',
      header: 'Cutting speed',
      enableGlobalFilter: false,
      cell: ({ getValue }) => <span className="whitespace-nowrap font-mono">{getValue() === null ? '—' : `${getValue()} mm/s`}</span>,
    },
    {
      accessorKey: 'density',
      header: 'Density',
      enableGlobalFilter: false,
      cell: ({ getValue }) => <span className="whitespace-nowrap font-mono">{getValue() === null ? '—' : `${getValue()} kg/m³`}</span>,
    },
    {
      id: 'sheets',
      accessorFn: (m) => formatSheetSizes(m.sheetSizes),
      header: 'Sheet sizes (mm)',
      enableSorting: false,
      cell: ({ getValue }) => <span className="block max-w-56 font-mono text-xs">{getValue()}</span>,
    },
    {
      id: 'status',
      accessorFn: (m) => (m.prohibited ? `prohibited ${m.prohibitedReason ?? ''}` : 'allowed'),
      header: 'Status',
      cell: ({ row }) => (row.original.prohibited ? <ProhibitedMark reason={row.original.prohibitedReason} /> : <span>Allowed</span>),
    },
  ];
  if (onEdit) {
    columns.push({
      id: 'actions',
      header: () => <span className="sr-only">Actions</span>,
      enableSorting: false,
      cell: ({ row }) => (
        <Button variant="quiet" size="sm" onClick={() => onEdit(row.original)} aria-label={`Edit ${row.original.name}`}>
          Edit
        </Button>
      ),
    });
  }
  return (
    <DataTable
      data={materials}
      columns={columns}
      caption="Material catalogue"
      filterLabel="Filter materials"
      filterPlaceholder="plywood"
      initialSorting={[{ id: 'name', desc: false }]}
      getRowId={(m) => String(m.id)}
      emptyMessage="The catalogue is empty. Add the first material with the form."
    />
  );
}
