import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from 'recharts';
import { CONTROL_LIMITS_MIN_POINTS, limitsWhenEnough } from '@shared/calc/control-limits';
import { quantityOf, type CheckValues } from '@shared/motors/check-values';
import { QUANTITY_INFO, type ComparedQuantity } from '@shared/motors/quantities';
import type { Check } from '@shared/schemas/motor';
import { fmt } from './format';

const INK = '#1d2a44';
const COPPER = '#b8693a';

const valuesOf = (c: Check): CheckValues => ({ readings: c.readings, ...c.computed });

/** One quantity over every check, with individuals-chart limits once there are enough checks. Loaded on demand (recharts is large). */
export default function HistoryChart({ checks, quantity }: { checks: Check[]; quantity: ComparedQuantity }) {
  const points = checks.flatMap((c, i) => {
    const v = quantityOf(valuesOf(c), quantity);
    return v ? [{ n: i + 1, date: c.testedAt.slice(0, 10), value: v.value }] : [];
  });
  const limits = limitsWhenEnough(points.map((p) => p.value));
  const info = QUANTITY_INFO[quantity];
  return (
    <figure className="m-0" data-chart="motor-history" data-limits={limits ? 'shown' : 'none'}>
      <figcaption className="mb-1 text-xs font-semibold tracking-wider text-ink-muted uppercase">
        {info.label} ({info.unit}) by check
      </figcaption>
      {points.length === 0 ? (
        <p className="text-sm text-ink-muted">No check has this quantity yet.</p>
      ) : (
        <div className="h-64 w-full">
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={points} margin={{ top: 8, right: 16, bottom: 4, left: 4 }}>
              <CartesianGrid stroke="#e4dccb" strokeDasharray="3 3" />
              <XAxis dataKey="n" tickFormatter={(n) => `#${n}`} stroke={INK} fontSize={12} />
              <YAxis domain={['auto', 'auto']} stroke={INK} fontSize={12} width={64} tickFormatter={(v) => fmt(quantity, v, false)} />
              <Tooltip formatter={(v) => [fmt(quantity, Number(v)), info.label]} labelFormatter={(n, p) => `Check #${n} · ${p?.[0]?.payload?.date ?? ''}`} />
              {limits && (
                <ReferenceLine
                  y={limits.upper}
                  stroke={COPPER}
                  strokeDasharray="6 4"
                  label={{ value: 'upper limit', position: 'insideTopRight', fontSize: 11, fill: COPPER }}
                />
              )}
              {limits && (
                <ReferenceLine
                  y={limits.mean}
                  stroke={INK}
                  strokeOpacity={0.5}
                  label={{ value: 'mean', position: 'insideTopRight', fontSize: 11, fill: INK }}
                />
              )}
              {limits && (
                <ReferenceLine
                  y={limits.lower}
                  stroke={COPPER}
                  strokeDasharray="6 4"
                  label={{ value: 'lower limit', position: 'insideBottomRight', fontSize: 11, fill: COPPER }}
                />
              )}
              <Line type="linear" dataKey="value" stroke={INK} strokeWidth={2} dot={{ r: 3, fill: COPPER }} isAnimationActive={false} />
            </LineChart>
          </ResponsiveContainer>
        </div>
      )}
      <p className="mt-1 text-xs text-ink-muted">
        {limits
          ? `Limits from this motor's own ${limits.n} checks: mean ± 2.66 × the average change between neighbouring checks. A point outside them, or a steady run to one side, is drift worth a look before it crosses a tolerance.`
          : `Control limits appear once the motor has ${CONTROL_LIMITS_MIN_POINTS} checks with this quantity (${points.length} so far).`}
      </p>
    </figure>
  );
}
