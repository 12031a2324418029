import { Link } from 'react-router-dom';
import { PAGE_PATTERNS } from '@shared/paths';
import { hasRole } from '@shared/constants';
import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { AuditLog } from '@/features/audit/components/audit-log';

/** /audit: moderators and administrators read who did what, when and why. */
export function AuditPage() {
  return (
    <RequireRole role="moderator">
      {(me) => (
        <>
          <PageHeader eyebrow={hasRole(me, 'admin') ? 'Moderators and administrators' : 'Moderators'} title="Audit log">
            Every change of state with who made it, when, and the reason they gave: reviews, restores, hidden pages, role changes and disabled accounts. Nothing
            here can be edited or removed.{' '}
            <span className="whitespace-nowrap">
              <Link to={PAGE_PATTERNS.reviewQueue}>Review queue</Link>
              {hasRole(me, 'admin') && (
                <>
                  {' · '}
                  <Link to={PAGE_PATTERNS.adminUsers}>Accounts</Link>
                </>
              )}
            </span>
          </PageHeader>
          <AuditLog />
        </>
      )}
    </RequireRole>
  );
}
