import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { UsersTable } from '@/features/admin/components/users-table';

export function AdminUsersPage() {
  return (
    <RequireRole role="admin">
      {(me) => (
        <>
          <PageHeader eyebrow="Administration" title="Accounts">
            Grant or remove the moderator role and disable abusive accounts. Disabling signs the account out everywhere at once. Every change is written to the
            audit log.
          </PageHeader>
          <UsersTable me={me} />
        </>
      )}
    </RequireRole>
  );
}
