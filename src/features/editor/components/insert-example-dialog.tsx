import { useMemo, useState } from 'react';
import { calculatorNames, getCalculator } from '@shared/calc/registry';
import { formatWorkedExample, parseWorkedExample } from '@shared/calc/worked-example';
import { exampleBlocks } from '@shared/content-checks/types';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { SelectField, TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';

const unitShown = (unit: string) => (unit === 'deg' ? '°' : unit);

/** A calculator's own example as form text, one string per field. */
function exampleValues(name: string): Record<string, string> {
  const calculator = getCalculator(name)!;
  const defaults = calculator.defaults as Record<string, unknown>;
  return Object.fromEntries(calculator.fields.map((f) => [f.key, defaults[f.key] === undefined ? '' : String(defaults[f.key])]));
}

/**
 * "Insert worked example": pick a calculator, fill its inputs by their labels and units, and get the
 * ```worked-example block written for you (checked by the same parser the page uses before it goes in).
 */
export function InsertExampleDialog({ open, onClose, onInsert }: { open: boolean; onClose: () => void; onInsert: (block: string) => void }) {
  const [name, setName] = useState<string>(calculatorNames[0]);
  const [values, setValues] = useState<Record<string, string>>(() => exampleValues(calculatorNames[0]));
  const [issues, setIssues] = useState<Record<string, string>>({});
  const calculator = useMemo(() => getCalculator(name)!, [name]);

  const handleCalculator = (next: string) => {
    setName(next);
    setValues(exampleValues(next));
    setIssues({});
  };

  const handleInsert = () => {
    const block = formatWorkedExample(name, values);
    const parsed = parseWorkedExample(exampleBlocks(block)[0]?.source ?? '');
    if (!parsed.ok) {
      setIssues(Object.fromEntries(parsed.issues.map((i) => [i.path, i.message])));
      return;
    }
    setIssues({});
    onInsert(block);
  };

  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Insert a worked example"
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button onClick={handleInsert}>Insert</Button>
        </>
      }
    >
      <div className="flex flex-col gap-3" data-testid="insert-example">
        <SelectField label="Calculator" value={name} onChange={(e) => handleCalculator(e.target.value)}>
          {calculatorNames.map((n) => (
            <option key={n} value={n}>
              {getCalculator(n)!.title}
            </option>
          ))}
        </SelectField>
        <p className="text-sm text-ink-soft">{calculator.description}</p>
        <div className="grid gap-3 sm:grid-cols-2">
          {calculator.fields.map((f) =>
            f.kind === 'select' ? (
              <SelectField
                key={`${name}-${f.key}`}
                label={f.label}
                hint={f.help}
                error={issues[f.key]}
                value={values[f.key] ?? ''}
                onChange={(e) => setValues((v) => ({ ...v, [f.key]: e.target.value }))}
              >
                {f.optional && <option value="">Not given</option>}
                {f.options?.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </SelectField>
            ) : (
              <TextField
                key={`${name}-${f.key}`}
                label={`${f.label}${f.unit ? ` (${unitShown(f.unit)})` : ''}${f.optional ? ', optional' : ''}`}
                inputMode="decimal"
                hint={[f.help, f.min !== undefined && f.max !== undefined ? `${f.min}–${f.max}${f.unit ? ` ${unitShown(f.unit)}` : ''}` : null]
                  .filter(Boolean)
                  .join(' ')}
                error={issues[f.key]}
                value={values[f.key] ?? ''}
                onChange={(e) => setValues((v) => ({ ...v, [f.key]: e.target.value }))}
              />
            ),
          )}
        </div>
        {issues[''] && <Notice tone="danger">{issues['']}</Notice>}
        <p className="text-xs text-ink-muted">The block goes in where the cursor is; readers see it as a live card they can change.</p>
      </div>
    </Dialog>
  );
}
