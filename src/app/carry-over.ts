/**
 * A server-drawn page is replaced by the app's own drawing when the app starts. Whatever a reader
 * typed into the header search box in that moment would go with the old DOM; this takes it across.
 */

const SELECTOR = 'header input[name="q"]';

/** Call before the app draws: remembers the server-drawn box. Returns what to call once it has drawn. */
export function keepHeaderSearch(): () => void {
  const old = document.querySelector<HTMLInputElement>(SELECTOR);
  if (!old) return () => {};
  let focused = document.activeElement === old;
  old.addEventListener('focus', () => (focused = true));
  // A blur caused by the box being taken out of the page is not the reader leaving it (the browser may
  // fire it while the box is still attached, so look once the removal is done).
  old.addEventListener('blur', () =>
    queueMicrotask(() => {
      if (old.isConnected) focused = false;
    }),
  );
  return () => {
    const box = document.querySelector<HTMLInputElement>(SELECTOR);
    if (!box || box === old) return;
    const value = old.value; // still readable once detached
    if (value && !box.value) {
      // The app's box is a controlled React input: set the value the way typing would, so its state follows.
      Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!.call(box, value);
      box.dispatchEvent(new Event('input', { bubbles: true }));
    }
    if (focused && (document.activeElement === document.body || document.activeElement === null)) {
      box.focus();
      const start = old.selectionStart ?? value.length;
      box.setSelectionRange(start, old.selectionEnd ?? start);
    }
  };
}
