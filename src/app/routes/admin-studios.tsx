import type { QueryClient } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { Studio } from '../../../shared/api/studios.js';
import { Card, CardHeader } from '../../components/ui/card.js';
import { DataTable } from '../../components/ui/data-table.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { RoleBadge } from '../../components/ui/role-badge.js';
import { studiosQueryOptions, useStudios } from '../../features/studios/api/get-studios.js';
import { CreateStudioForm } from '../../features/studios/components/create-studio-form.js';
import { formatDate } from '../../lib/format.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(studiosQueryOptions());
    return null;
  };
}

const column = createColumnHelper<Studio>();
const columns = [
  column.accessor('name', {
    header: 'Studio',
    cell: (info) => (
      <Link to={`/studios/${info.row.original.id}`} className="font-medium">
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor('description', {
    header: 'Description',
    enableSorting: false,
    cell: (info) => <span className="line-clamp-2 text-ink-soft">{info.getValue() || '—'}</span>,
  }),
  column.accessor('memberCount', {
    header: 'Members',
    enableGlobalFilter: false,
    cell: (info) => <span className="font-mono">{info.getValue()}</span>,
  }),
  column.accessor((s) => s.myRole ?? '', {
    id: 'myRole',
    header: 'Your role',
    cell: (info) => (info.row.original.myRole ? <RoleBadge role={info.row.original.myRole} /> : <span className="text-ink-soft">—</span>),
  }),
  column.accessor('createdAt', {
    header: 'Created',
    enableGlobalFilter: false,
    cell: (info) => <span className="font-mono text-xs">{formatDate(info.getValue())}</span>,
  }),
];

export function Component() {
  useDocumentTitle('All studios');
  const { data: studios } = useStudios();
  return (
    <div>
      <PageHeader eyebrow="Admin" title="All studios" description="Every studio of the maker space. Create one, then invite its instructor from the studio page." />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <Card aria-labelledby="studio-list-heading">
          <CardHeader id="studio-list-heading" title="Studios" />
          <DataTable
            data={studios}
            columns={columns}
            caption="All studios"
            filterLabel="Filter studios"
            filterPlaceholder="Name or description"
            initialSorting={[{ id: 'name', desc: false }]}
            getRowId={(s) => String(s.id)}
            emptyMessage="No studios yet. Create the first one."
          />
        </Card>
        <Card aria-labelledby="create-studio-heading">
          <CardHeader id="create-studio-heading" title="New studio" />
          <CreateStudioForm />
        </Card>
      </div>
    </div>
  );
}
