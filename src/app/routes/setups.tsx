import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { useCurrentUser } from '@/features/auth/api/auth';
import { setupQueries } from '@/features/setups/api/setups';
import { BaselinesTable } from '@/features/setups/components/baselines-table';
import { UploadForm } from '@/features/setups/components/upload-form';
import { UploadsList } from '@/features/setups/components/uploads-list';

export function SetupsPage() {
  const me = useCurrentUser();
  const library = useQuery(setupQueries.library());
  return (
    <>
      <PageHeader
        eyebrow="Setup library"
        title="Baseline setups"
        actions={
          <>
            <Link to="/runs" className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep">
              Run logs
            </Link>
            <Link
              to="/setups/compare"
              className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep"
            >
              Compare two setups
            </Link>
            <Link to="/setups/new" className="rounded-md bg-copper px-4 py-2 font-medium text-white no-underline hover:bg-copper-dark">
              Build a setup
            </Link>
          </>
        }
      >
        The baseline of every live guide, as a setup record you can download (JSON or CSV), print, or compare with your own before you try it.
      </PageHeader>
      <div className="flex flex-col gap-10">
        <section aria-labelledby="baselines-title">
          <h2 id="baselines-title" className="mb-3 text-xl font-semibold">
            Published baselines
          </h2>
          {library.isPending && <Spinner />}
          {library.error && <Notice tone="danger">The setup library could not be loaded. Try again in a moment.</Notice>}
          {library.data && <BaselinesTable baselines={library.data.baselines} />}
        </section>
        <section aria-labelledby="mine-title" className="grid gap-6 lg:grid-cols-[1fr_1.2fr]">
          <div>
            <h2 id="mine-title" className="mb-3 text-xl font-semibold">
              Upload your setup
            </h2>
            {me.data ? (
              <Card className="p-4">
                <UploadForm />
              </Card>
            ) : (
              <Card className="p-4 text-sm">
                <Link to="/sign-in?next=%2Fsetups">Sign in</Link> to upload your own setups and compare them with a baseline. Uploads are private to your
                account.
              </Card>
            )}
          </div>
          {me.data && (
            <div>
              <h2 className="mb-3 text-xl font-semibold">Your uploads</h2>
              {library.data && <UploadsList uploads={library.data.uploads} />}
            </div>
          )}
        </section>
      </div>
    </>
  );
}
