import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { Workbench } from '@/features/editor/components/workbench';

export function WorkbenchPage() {
  return (
    <RequireRole role="member">
      {() => (
        <>
          <PageHeader
            eyebrow="Your account"
            title="My workbench"
            actions={
              <>
                <Link to="/motors" className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep">
                  Motor bench
                </Link>
                <Link to="/guides/new" className="rounded-md bg-copper px-4 py-2 font-medium text-white no-underline hover:bg-copper-dark">
                  Write a guide
                </Link>
              </>
            }
          >
            Your drafts and proposals, where each one stands, and the moderator’s reason when one was sent back.
          </PageHeader>
          <Workbench />
        </>
      )}
    </RequireRole>
  );
}
