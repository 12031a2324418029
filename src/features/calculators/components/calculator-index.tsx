import { Link } from 'react-router-dom';
import { calculatorNames, calculators } from '@shared/calc/registry';
import { Card } from '@/components/ui/card';
import { hasChart, unitLabel } from './result-format';

/** One card per calculator, naming what goes in, so a reader can pick the right one at a glance. */
export function CalculatorIndex() {
  return (
    <ul className="grid list-none gap-4 p-0 sm:grid-cols-2">
      {calculatorNames.map((name) => {
        const calc = calculators[name];
        return (
          <li key={name}>
            <Link to={`/calculators/${name}`} className="group block h-full no-underline">
              <Card className="flex h-full flex-col p-5 transition group-hover:border-copper/50 group-hover:shadow-md group-focus-visible:border-copper">
                <h2 className="font-serif text-lg font-bold text-ink">{calc.title}</h2>
                <p className="mt-1.5 text-sm leading-6 text-ink-soft">{calc.description}</p>
                <p className="mt-3 text-xs leading-5 text-ink-muted">
                  <span className="font-semibold text-ink-soft">Inputs: </span>
                  {calc.fields.map((f) => (f.unit && f.kind === 'number' ? `${f.label} (${unitLabel(f.unit)})` : f.label)).join(' · ')}
                </p>
                <p className="mt-auto pt-3 text-sm font-medium text-copper-dark">Open {hasChart(name) ? 'with chart ' : ''}→</p>
              </Card>
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
