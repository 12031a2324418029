import { type KeyboardEvent } from 'react';
import { NavLink } from 'react-router-dom';
import { useDisclosure } from '@/lib/use-disclosure';

/** The racer's own records, reached from one header entry. */
export const NOTEBOOK_LINKS = [
  { to: '/setups', label: 'Setups', hint: 'Car setups, compared with a baseline' },
  { to: '/runs', label: 'Run logs', hint: 'Logged runs, figures and comparisons' },
  { to: '/motors', label: 'Motors', hint: 'Your motors and their bench checks' },
] as const;

/**
 * "Notebook": one header entry opening the racer's setups, run logs and motors. A disclosure button with a
 * list of links (navigation, not an application menu): Escape or a click elsewhere closes it and Escape puts
 * focus back on the button; arrow keys move between the links. On a phone it unfolds inside the main menu.
 */
export function NotebookMenu({ onNavigate }: { onNavigate?: () => void }) {
  const { open, setOpen, box, button, panelId: listId, location, onKey } = useDisclosure();
  const active = NOTEBOOK_LINKS.some((l) => location.pathname === l.to || location.pathname.startsWith(`${l.to}/`));

  const links = () => Array.from(box.current?.querySelectorAll<HTMLAnchorElement>('ul a') ?? []);
  const handleKey = (e: KeyboardEvent) => {
    if (onKey(e)) return;
    if (e.key !== 'ArrowDown' && e.key !== 'ArrowUp') return;
    e.preventDefault();
    if (!open) setOpen(true);
    // The list renders on open; move focus once it is there.
    requestAnimationFrame(() => {
      const all = links();
      const at = all.indexOf(document.activeElement as HTMLAnchorElement);
      const next = e.key === 'ArrowDown' ? (at + 1) % all.length : at <= 0 ? all.length - 1 : at - 1;
      all[next]?.focus();
    });
  };

  return (
    <div ref={box} className="relative" onKeyDown={handleKey}>
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={listId}
        onClick={() => setOpen((o) => !o)}
        className={`flex w-full items-center gap-0.5 rounded-md px-2 py-1.5 text-left text-sm font-medium md:w-auto md:px-1 ${
          active ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep'
        }`}
      >
        Notebook
        <svg viewBox="0 0 12 12" className={`h-2.5 w-2.5 transition-transform ${open ? 'rotate-180' : ''}`} aria-hidden>
          <path d="M2 4 L6 8 L10 4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
      </button>
      {open && (
        <ul
          id={listId}
          className="z-30 mt-1 flex list-none flex-col gap-0.5 rounded-md border border-paper-line bg-paper-card p-1 pl-1 md:absolute md:left-0 md:w-64 md:shadow-lg"
        >
          {NOTEBOOK_LINKS.map((l) => (
            <li key={l.to} className="m-0">
              <NavLink
                to={l.to}
                onClick={() => {
                  setOpen(false);
                  onNavigate?.();
                }}
                className={({ isActive }) =>
                  `flex flex-col rounded px-2 py-1.5 text-sm no-underline ${isActive ? 'bg-ink text-paper' : 'text-ink hover:bg-paper-deep focus:bg-paper-deep'}`
                }
              >
                <span className="font-medium">{l.label}</span>
                <span className="text-xs opacity-75">{l.hint}</span>
              </NavLink>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
