/** Splits a parameter entry's body into the reading part and its "## Cautions" section (without the heading). */
export function splitCautions(body: string): { main: string; cautions: string | null } {
  const heading = /^##[ \t]+Cautions[ \t]*$/m.exec(body);
  if (!heading) return { main: body, cautions: null };
  const after = body.slice(heading.index + heading[0].length);
  const next = /^##[ \t]+\S/m.exec(after);
  const cautions = (next ? after.slice(0, next.index) : after).trim();
  const main = body.slice(0, heading.index) + (next ? after.slice(next.index) : '');
  return { main: main.trim() + '\n', cautions: cautions || null };
}
