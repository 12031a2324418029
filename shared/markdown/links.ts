/** A bare slug link in a parameter entry (`[drag brake](drag-brake)`) points at another entry. */
export function resolveParameterHref(href: string): string {
  if (/^[a-z0-9]+(?:-[a-z0-9]+)*$/.test(href)) return `/parameters/${href}`;
  return href;
}
