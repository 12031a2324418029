const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric' });
const dateTimeFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** "3 March 2026", or an empty string when there is no date. */
export function formatDate(iso: string | null | undefined) {
  return iso ? dateFormat.format(new Date(iso)) : '';
}

/** "3 Mar 2026, 10:42". */
export function formatDateTime(iso: string | null | undefined) {
  return iso ? dateTimeFormat.format(new Date(iso)) : '';
}
