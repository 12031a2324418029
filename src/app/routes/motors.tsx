import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { Card, PageHeader, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { RequireRole } from '@/components/layout/guards';
import { motorQueries } from '@/features/motors/api/motors';
import { MotorForm } from '@/features/motors/components/motor-form';
import { fmtDate } from '@/features/motors/components/format';

function MotorList() {
  const list = useQuery(motorQueries.list());
  if (list.isPending) return <Spinner />;
  if (list.error) return <Notice tone="danger">Your motors could not be loaded. Try again in a moment.</Notice>;
  if (!list.data.length)
    return <p className="text-sm text-ink-muted">No motors yet. Register the first one, then add a bench check before you take it apart.</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label="Your motors">
      {list.data.map((m) => (
        <li key={m.id}>
          <Link to={`/motors/${m.id}`} className="block rounded-lg border border-paper-line bg-paper-card px-4 py-3 text-ink no-underline hover:border-copper">
            <span className="font-semibold">{m.label}</span>
            <span className="block text-sm text-ink-muted">
              {[m.kvRpmPerV ? `${m.kvRpmPerV} rpm/V` : null, m.windTurns ? `${m.windTurns} T` : null, `${m.poles}-pole`, m.sensored ? 'sensored' : 'sensorless']
                .filter(Boolean)
                .join(' · ')}{' '}
              · {m.checkCount === 1 ? '1 check' : `${m.checkCount} checks`}
              {m.lastTestedAt && `, last ${fmtDate(m.lastTestedAt)}`}
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}

/** The member's motor register. */
export function MotorsPage() {
  const navigate = useNavigate();
  return (
    <>
      <PageHeader eyebrow="Your notebook" title="Motor bench">
        Keep each motor&rsquo;s bench checks — speed and current without load, timing, rotor symmetry, sensor signal and resistance — so after a rebuild you can
        tell whether it went back together as the same motor. Private to your account.
      </PageHeader>
      <RequireRole role="member">
        {() => (
          <div className="grid gap-8 lg:grid-cols-[1.2fr_1fr]">
            <section aria-labelledby="motors-title">
              <h2 id="motors-title" className="mb-3 text-xl font-semibold">
                Your motors
              </h2>
              <MotorList />
            </section>
            <section aria-labelledby="register-title">
              <h2 id="register-title" className="mb-3 text-xl font-semibold">
                Register a motor
              </h2>
              <Card className="p-4">
                <MotorForm onCreated={(m) => navigate(`/motors/${m.id}`)} />
              </Card>
            </section>
          </div>
        )}
      </RequireRole>
    </>
  );
}
