import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { AccountPanel } from '@/features/auth/components/account-panel';
import { WatchSettingsPanel } from '@/features/watches/components/watch-settings';

export function AccountPage() {
  return (
    <RequireRole role="member">
      {(user) => (
        <>
          <PageHeader eyebrow="Your account" title={user.displayName}>
            Your profile and password. Drafts, proposals and uploaded setups appear on their own pages.
          </PageHeader>
          <AccountPanel user={user} />
          <div className="mt-6">
            <WatchSettingsPanel />
          </div>
        </>
      )}
    </RequireRole>
  );
}
