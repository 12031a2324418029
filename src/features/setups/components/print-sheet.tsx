import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Spinner } from '@/components/ui/card';
import { ApiError } from '@/lib/api-client';
import { formatQuantity, formatRatio } from '@shared/units';
import { useUnits } from '@/lib/preferences';
import { guideSetupLinks, setupQueries } from '../api/setups';
import { fmt } from './labels';
import { RecordTable } from './record-table';

/** The printable setup sheet of a guide's baseline: black on white, fits one A4 page. */
export function PrintSheet({ slug }: { slug: string }) {
  const q = useQuery(setupQueries.guide(slug));
  const names = useQuery(setupQueries.escSettings());
  const units = useUnits();
  if (q.isPending) return <Spinner label="Loading the setup sheet…" />;
  if (q.error)
    return (
      <div className="mx-auto max-w-xl p-8">
        <h1 className="font-serif text-2xl font-bold">No setup sheet</h1>
        <p className="mt-2">
          {q.error instanceof ApiError && q.error.status === 404 ? 'This guide has no published baseline setup.' : 'The setup could not be loaded.'}
        </p>
        <Link to="/setups">Back to the setup library</Link>
      </div>
    );
  const { record, computed } = q.data;
  const p = record.provenance;
  const libraryNames = Object.fromEntries((names.data ?? []).map((d) => [d.slug, d.name]));
  const links = guideSetupLinks(slug);
  const serious = computed.cautions.filter((c) => c.level !== 'info');
  const notes = computed.cautions.filter((c) => c.level === 'info');
  return (
    <div className="print-sheet mx-auto max-w-[210mm] bg-white p-6 text-black print:max-w-none print:p-0">
      <div className="no-print mb-6 flex flex-wrap items-center gap-3 border-b border-paper-line pb-4">
        <Link to={`/guides/${slug}`}>← Back to the guide</Link>
        <Link to="/setups">Setup library</Link>
        <button type="button" onClick={() => window.print()} className="ml-auto rounded-md bg-copper px-4 py-2 font-medium text-white hover:bg-copper-dark">
          Print
        </button>
        <a href={links.json} download>
          JSON
        </a>
        <a href={links.csv} download>
          CSV
        </a>
      </div>
      <header className="mb-4 border-b-2 border-black pb-2">
        <p className="text-xs tracking-[0.14em] uppercase">Tunewright setup sheet · tunewright.setup v{record.schemaVersion}</p>
        <h1 className="font-serif text-2xl leading-tight font-bold">{p?.guideTitle ?? slug}</h1>
        <p className="text-sm">
          Version {p?.revisionNumber} by {p?.authorDisplayName} · exported{' '}
          {p?.exportedAt ? new Date(p.exportedAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' }) : ''}
        </p>
      </header>
      <section className="mb-4 grid grid-cols-3 gap-3 border border-black p-3 text-sm sm:grid-cols-6 print:grid-cols-6" aria-label="Computed values">
        {[
          ['Final drive', computed.gearing ? formatRatio(computed.gearing.finalDriveRatio) : '—'],
          ['Rollout', computed.gearing ? formatQuantity('rollout', computed.gearing.rolloutMm, units) : '—'],
          ['No-load', computed.motor ? `${fmt(computed.motor.noLoadRpm, 0)} rpm` : '—'],
          ['Top speed (est.)', computed.speed ? formatQuantity('speed', computed.speed.loadedKmh, units) : '—'],
          ['Pack full / nominal', computed.pack ? `${fmt(computed.pack.fullV)} / ${fmt(computed.pack.nominalV)} V` : '—'],
          ['Cutoff', computed.pack?.cutoffV ? `${fmt(computed.pack.cutoffV)} V` : 'not set'],
        ].map(([label, value]) => (
          <div key={label}>
            <div className="text-[0.7rem] tracking-wide uppercase">{label}</div>
            <div className="font-semibold tabular-nums">{value}</div>
          </div>
        ))}
        {computed.timing && (
          <p className="col-span-full text-xs">
            Total timing at {fmt(computed.timing.atRpm, 0)} rpm: {fmt(computed.timing.totalDeg, 1)}° ({fmt(computed.timing.controllerDeg, 1)}° controller +{' '}
            {fmt(computed.timing.endbellElectricalDeg, 1)}° endbell, electrical). Speeds at the pack's nominal voltage.
          </p>
        )}
      </section>
      <RecordTable record={record} names={libraryNames} />
      {record.notes && (
        <section className="mt-4 break-inside-avoid">
          <h3 className="mb-1 border-b border-black/40 text-sm font-semibold tracking-wide uppercase">Notes</h3>
          <p className="text-sm whitespace-pre-line">{record.notes}</p>
        </section>
      )}
      <section className="mt-4 break-inside-avoid border-2 border-black p-3 text-sm" aria-label="Cautions">
        <h3 className="mb-1 font-semibold tracking-wide uppercase">Cautions</h3>
        <ul className="list-disc space-y-1 pl-5">
          {serious.map((c, i) => (
            <li key={`s${i}`}>
              <strong>{c.level === 'danger' ? 'Danger: ' : 'Caution: '}</strong>
              {c.message}
            </li>
          ))}
          {notes.map((c, i) => (
            <li key={`n${i}`}>{c.message}</li>
          ))}
          <li>Settings are starting points. The equipment makers' instructions and your track's and sanctioning body's rules come first.</li>
        </ul>
      </section>
    </div>
  );
}
