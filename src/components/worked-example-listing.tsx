/**
 * A worked-example block shown as a tidy listing of its inputs: used where the live calculator
 * card is not composed (it keeps every value readable, and never runs anything).
 */
export function WorkedExampleListing({ body }: { body: string }) {
  const lines = body.split('\n').map((l) => l.trimEnd()).filter((l) => l.trim() !== '');
  const calcLine = lines.find((l) => /^calc\s*:/.test(l));
  const calc = calcLine?.replace(/^calc\s*:\s*/, '').trim();
  const rows = lines.filter((l) => l !== calcLine).map((l) => {
    const at = l.indexOf(':');
    return at > 0 ? { key: l.slice(0, at).trim(), value: l.slice(at + 1).trim() } : { key: '', value: l.trim() };
  });
  return (
    <figure className="my-6 overflow-hidden rounded-lg border border-paper-line bg-paper-card font-sans not-italic">
      <figcaption className="flex items-center justify-between gap-2 border-b border-paper-line bg-paper-deep px-4 py-2 text-xs font-semibold tracking-wider text-ink-soft uppercase">
        <span>Worked example{calc ? ` · ${calc}` : ''}</span>
      </figcaption>
      <dl className="grid grid-cols-[max-content_1fr] gap-x-6 gap-y-1 px-4 py-3 font-mono text-sm leading-6">
        {rows.map((r, i) => (
          <div key={i} className="contents">
            <dt className="text-ink-muted">{r.key}</dt>
            <dd className="text-ink">{r.value}</dd>
          </div>
        ))}
      </dl>
    </figure>
  );
}
