import { runCalculator } from '../calc/registry';
import { parseWorkedExample } from '../calc/worked-example';
import { exampleBlocks, type CheckSubject, type ContentCheck } from './types';

/** How far either side of a worked example the text may give its caution, in characters. */
export const CAUTION_WINDOW_CHARS = 600;

/** Words that make a sentence a caution in the trade's usual phrasing. */
const CAUTION_WORDS =
  /\b(caution|careful|stop|let (it|them) cool|too hot|never|danger|warning|limit|limits|burns?|fire|damage|damaged|lose strength|retire|do not|don't|rules?|protection|over-discharge|over-drain|maker's)\b/i;

/**
 * Rule `caution-near-example`: a worked example whose result crosses a caution (a motor in the hot band,
 * a cutoff under the chemistry's window, a cell over its full voltage…) has a caution in the text near it,
 * so a reader who only looks at the card still meets it. A danger without one is an error, a caution a warning.
 */
export function cautionNearExample(subject: CheckSubject): ContentCheck[] {
  const found: ContentCheck[] = [];
  for (const block of exampleBlocks(subject.body)) {
    const parsed = parseWorkedExample(block.source);
    if (!parsed.ok) continue;
    const run = runCalculator(parsed.calc, parsed.rawInputs);
    if (!run.ok) continue;
    const serious = run.output.warnings.filter((w) => w.level === 'danger' || w.level === 'caution');
    if (serious.length === 0) continue;
    const near =
      subject.body.slice(Math.max(0, block.start - CAUTION_WINDOW_CHARS), block.start) + subject.body.slice(block.end, block.end + CAUTION_WINDOW_CHARS);
    if (CAUTION_WORDS.test(near)) continue;
    const worst = serious.some((w) => w.level === 'danger') ? 'danger' : 'caution';
    const first = serious.find((w) => w.level === worst)!;
    found.push({
      rule: 'caution-near-example',
      severity: worst === 'danger' ? 'error' : 'warning',
      path: `examples[${block.index}]${first.field ? `.${first.field}` : ''}`,
      message: `Worked example ${block.index + 1} ends in a ${worst} ("${first.message.split('. ')[0]}.") but the text around it gives no caution. Say what to do, and defer to the maker's instructions.`,
    });
  }
  return found;
}
