/* global localStorage, document */
// Puts a chosen colour theme (light or dark) on the page before it is painted; "system" (the default)
// leaves it to prefers-color-scheme. The same key is written by src/lib/preferences.ts.
try {
  var t = localStorage.getItem('tw.theme');
  if (t === 'light' || t === 'dark') document.documentElement.dataset.theme = t;
} catch (e) {
  // storage switched off: the system setting holds
}
