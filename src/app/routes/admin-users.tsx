import type { QueryClient } from '@tanstack/react-query';
import { Card } from '../../components/ui/card.js';
import { PageHeader } from '../../components/ui/page-header.js';
import { useMe } from '../../features/auth/api/get-me.js';
import { usersQueryOptions, useUsers } from '../../features/admin/api/get-users.js';
import { UsersTable } from '../../features/admin/components/users-table.js';
import { useDocumentTitle } from '../../lib/use-document-title.js';

export function makeLoader(queryClient: QueryClient) {
  return async () => {
    await queryClient.ensureQueryData(usersQueryOptions());
    return null;
  };
}

export function Component() {
  useDocumentTitle('Users');
  const { data: users } = useUsers();
  const { data: me } = useMe();
  return (
    <div>
      <PageHeader
        eyebrow="Admin"
        title="Users"
        description="Everyone with an account. Global roles apply across the maker space; studio roles are set by each studio's instructors."
      />
      <Card aria-label="All users">
        <UsersTable users={users} currentUserId={me?.id ?? -1} />
      </Card>
    </div>
  );
}
