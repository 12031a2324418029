import { toast } from '@/lib/toast';
import type { UnitSystem } from '@shared/units';
import { useDisclosure } from '@/lib/use-disclosure';
import { THEMES, useSetUnits, useTheme, useUnits, type ThemeChoice } from '@/lib/preferences';

const UNIT_CHOICES: Array<{ value: UnitSystem; label: string; hint: string }> = [
  { value: 'metric', label: 'Metric', hint: 'mm, km/h, °C' },
  { value: 'imperial', label: 'Imperial', hint: 'in, mph, °F' },
];
const THEME_LABELS: Record<ThemeChoice, string> = { system: 'System', light: 'Light', dark: 'Dark' };

/**
 * "Display": units (metric or imperial) and colour theme (system, light, dark), from one small header
 * button so the header keeps its single row. A disclosure with two radio groups; Escape or a click
 * elsewhere closes it, Escape puts focus back on the button.
 */
export function DisplayMenu() {
  const { open, setOpen, box, button, panelId, onKey: handleKey } = useDisclosure();
  const units = useUnits();
  const setUnits = useSetUnits();
  const [theme, setTheme] = useTheme();

  const chooseUnits = (u: UnitSystem) => {
    setUnits(u).catch(() => toast.error('Your units could not be saved to your account; they apply on this device.'));
  };

  const radio = 'flex cursor-pointer items-center gap-2 rounded px-2 py-1 text-sm hover:bg-paper-deep has-[:checked]:font-semibold';
  return (
    <div ref={box} className="relative" onKeyDown={handleKey}>
      <button
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls={panelId}
        title={`Display: ${units} units, ${theme === 'system' ? 'theme as the device' : `${theme} theme`}`}
        onClick={() => setOpen((o) => !o)}
        className="flex items-center rounded-md border border-ink/20 p-1.5 text-sm text-ink hover:bg-paper-deep"
      >
        {/* A half-filled circle: light and dark. */}
        <svg viewBox="0 0 16 16" className="h-5 w-5" aria-hidden>
          <circle cx="8" cy="8" r="6.25" fill="none" stroke="currentColor" strokeWidth="1.5" />
          <path d="M8 1.75 A6.25 6.25 0 0 1 8 14.25 Z" fill="currentColor" />
        </svg>
        <span className="sr-only">Display</span>
      </button>
      {open && (
        <div
          id={panelId}
          role="group"
          aria-label="Display"
          className="absolute right-0 z-40 mt-1 flex w-60 flex-col gap-3 rounded-md border border-paper-line bg-paper-card p-3 shadow-lg"
        >
          <fieldset>
            <legend className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Units</legend>
            {UNIT_CHOICES.map((c) => (
              <label key={c.value} className={radio}>
                <input type="radio" name={`${panelId}-units`} value={c.value} checked={units === c.value} onChange={() => chooseUnits(c.value)} />
                {c.label}
                <span className="ml-auto text-xs font-normal text-ink-muted">{c.hint}</span>
              </label>
            ))}
          </fieldset>
          <fieldset>
            <legend className="mb-1 text-xs font-semibold tracking-wide text-ink-muted uppercase">Theme</legend>
            {THEMES.map((t) => (
              <label key={t} className={radio}>
                <input type="radio" name={`${panelId}-theme`} value={t} checked={theme === t} onChange={() => setTheme(t)} />
                {THEME_LABELS[t]}
                {t === 'system' && <span className="ml-auto text-xs font-normal text-ink-muted">follows the device</span>}
              </label>
            ))}
          </fieldset>
          <p className="text-xs leading-5 text-ink-muted">Figures are stored in metric; only how they are shown changes.</p>
        </div>
      )}
    </div>
  );
}
