import { Link } from 'react-router-dom';
import { PAGE_PATTERNS } from '@shared/paths';
import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { UsersTable } from '@/features/admin/components/users-table';

export function AdminUsersPage() {
  return (
    <RequireRole role="admin">
      {(me) => (
        <>
          <PageHeader eyebrow="Administration" title="Accounts" actions={<Link to={PAGE_PATTERNS.audit}>Audit log</Link>}>
            Grant or remove the moderator role and disable abusive accounts, each with a reason. Disabling signs the account out everywhere at once. Every
            change is written to the audit log with its reason.
          </PageHeader>
          <UsersTable me={me} />
        </>
      )}
    </RequireRole>
  );
}
