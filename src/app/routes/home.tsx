import { Link } from 'react-router-dom';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';

const JOURNEYS = [
  {
    to: '/parameters',
    title: 'Look up a setting',
    body: 'What drag brake, punch, ramped advance or low-voltage cutoff does, which way to move it, and what it costs in heat and run time.',
  },
  {
    to: '/guides',
    title: 'Read a tuner’s guide',
    body: 'Written for one class on one track, checked by a moderator before it goes live, with every earlier version kept.',
  },
  {
    to: '/setups',
    title: 'Download a baseline',
    body: 'A setup record to start from, and a side-by-side comparison with your own: ratio, rollout, top speed and pack cutoff.',
  },
  {
    to: '/calculators',
    title: 'Work the numbers',
    body: 'Gearing, motor speed, timing curve, pack voltages, throttle and brake, temperature — recomputed as you type.',
  },
];

export function HomePage() {
  return (
    <div className="flex flex-col gap-10">
      <section className="grid items-center gap-8 md:grid-cols-[1.3fr_1fr]">
        <div>
          <p className="text-xs font-semibold tracking-[0.14em] text-copper uppercase">Tidewater RC Club · Harbour Flats Indoor</p>
          <h1 className="mt-2 font-serif text-4xl leading-tight font-bold sm:text-5xl">The tuning notebook for speed controllers, motors and gearing.</h1>
          <p className="mt-4 max-w-xl text-lg text-ink-soft">
            Every setting explained in plain words, worked examples you can recompute with your own numbers, and guides from experienced tuners — each edit
            reviewed by a moderator before it goes live.
          </p>
          <div className="mt-6 flex flex-wrap gap-3">
            <Link to="/parameters" className="rounded-md bg-copper px-4 py-2 font-medium text-white no-underline hover:bg-copper-dark">
              Browse the parameter library
            </Link>
            <Link to="/guides" className="rounded-md border border-ink/25 bg-paper-card px-4 py-2 font-medium text-ink no-underline hover:bg-paper-deep">
              Read the guides
            </Link>
          </div>
        </div>
        <Card className="p-5 font-mono text-sm leading-7" aria-label="A worked example, as it appears in a guide">
          <p className="mb-2 font-sans text-xs font-semibold tracking-wider text-ink-muted uppercase">From a guide</p>
          <p>spur 84 · pinion 30 · internal 2.6 · tyre 62 mm</p>
          <p className="text-copper-dark">final drive 7.28 : 1 · rollout 26.8 mm</p>
          <p className="mt-3 font-sans text-xs text-ink-muted">Change any number and the result follows — right inside the guide.</p>
        </Card>
      </section>
      <section aria-labelledby="journeys" className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <h2 id="journeys" className="sr-only">
          What you can do here
        </h2>
        {JOURNEYS.map((j) => (
          <Link key={j.to} to={j.to} className="group no-underline">
            <Card className="h-full p-5 transition group-hover:border-copper/50 group-hover:shadow-md">
              <h3 className="font-semibold text-ink">{j.title}</h3>
              <p className="mt-2 text-sm text-ink-soft">{j.body}</p>
            </Card>
          </Link>
        ))}
      </section>
      <Notice tone="caution" title="Heat and lithium packs deserve respect">
        Aggressive timing and tall gearing heat motors and controllers; over-discharging a lithium pack damages it and can start a fire. Check temperatures
        after a few minutes on track, charge on a fire-safe surface, and follow your equipment maker’s instructions and your track’s and sanctioning body’s
        rules.
      </Notice>
    </div>
  );
}
