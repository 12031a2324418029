import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { AccountPanel } from '@/features/auth/components/account-panel';
import { AccountDataPanel } from '@/features/auth/components/account-data-panel';
import { WatchSettingsPanel } from '@/features/watches/components/watch-settings';

export function AccountPage() {
  return (
    <RequireRole role="member">
      {(user) => (
        <>
          <PageHeader eyebrow="Your account" title={user.displayName}>
            Your profile, password and data. Drafts and proposals are on your workbench; setups, run logs and motors in the notebook.
          </PageHeader>
          <AccountPanel user={user} />
          <div className="mt-6">
            <WatchSettingsPanel />
          </div>
          <div className="mt-6">
            <AccountDataPanel />
          </div>
        </>
      )}
    </RequireRole>
  );
}
