import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Card, Spinner } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';
import { guideSetupLinks, setupQueries } from '../api/setups';
import { CautionList } from './caution-list';
import { ComputedValues } from './computed-values';
import { RecordTable } from './record-table';

const linkButton =
  'inline-flex items-center rounded-md border border-ink/25 bg-paper-card px-3 py-1.5 text-sm font-medium text-ink no-underline hover:bg-paper-deep';

/**
 * The baseline box for a guide page: download buttons (JSON, CSV, print), the key computed
 * values, the cautions and every setting of the record. Renders nothing when the live revision has no baseline.
 */
export function SetupSheet({ slug, names }: { slug: string; names?: Record<string, string> }) {
  const q = useQuery(setupQueries.guide(slug));
  if (q.isPending) return <Spinner label="Loading the baseline setup…" />;
  if (q.error)
    return q.error instanceof ApiError && q.error.status === 404 ? null : <p className="text-sm text-danger">The baseline setup could not be loaded.</p>;
  const { record, computed } = q.data;
  const links = guideSetupLinks(slug);
  return (
    <Card className="flex flex-col gap-4 p-5" aria-labelledby="setup-sheet-title" role="region">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <h2 id="setup-sheet-title" className="font-sans text-lg font-semibold">
            Baseline setup
          </h2>
          <p className="text-sm text-ink-muted">
            Version {record.provenance?.revisionNumber} by {record.provenance?.authorDisplayName}. A starting point, not a rule: your equipment maker's
            instructions and your track's rules come first.
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          <a className={linkButton} href={links.json} download>
            Download JSON
          </a>
          <a className={linkButton} href={links.csv} download>
            Download CSV
          </a>
          <Link className={linkButton} to={links.print}>
            Print sheet
          </Link>
          <Link className={linkButton} to={`/setups/compare?a=guide:${encodeURIComponent(slug)}`}>
            Compare with mine
          </Link>
        </div>
      </div>
      <section aria-labelledby="setup-figures-title">
        <h3 id="setup-figures-title" className="mb-2 text-sm font-semibold text-ink-soft">
          What these settings give
        </h3>
        <ComputedValues computed={computed} />
      </section>
      <CautionList cautions={computed.cautions} />
      <section aria-labelledby="setup-settings-title" data-testid="baseline-settings">
        <h3 id="setup-settings-title" className="mb-2 text-sm font-semibold text-ink-soft">
          The settings
        </h3>
        <RecordTable record={record} names={names} />
      </section>
    </Card>
  );
}
