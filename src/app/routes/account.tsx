import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { AccountPanel } from '@/features/auth/components/account-panel';

export function AccountPage() {
  return (
    <RequireRole role="member">
      {(user) => (
        <>
          <PageHeader eyebrow="Your account" title={user.displayName}>
            Your profile and password. Drafts, proposals and uploaded setups appear on their own pages.
          </PageHeader>
          <AccountPanel user={user} />
        </>
      )}
    </RequireRole>
  );
}
