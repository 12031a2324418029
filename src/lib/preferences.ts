import { useCallback, useMemo, useSyncExternalStore } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import type { User } from '@shared/schemas/user';
import { DEFAULT_UNITS, UNIT_SYSTEMS, type UnitSystem } from '@shared/units';
import { api, type Envelope } from '@/lib/api-client';
import { meQuery } from '@/lib/session';

/**
 * Display preferences (#17): units and colour theme. A member's units live in the account (PATCH
 * /api/account) so they follow them to any device; a visitor's, and everyone's theme, live in this
 * browser's localStorage. src/public/theme-init.js reads the same theme key before the first paint.
 */
export const THEMES = ['system', 'light', 'dark'] as const;
export type ThemeChoice = (typeof THEMES)[number];

const KEYS = { units: 'tw.units', theme: 'tw.theme' } as const;
const listeners = new Set<() => void>();

function read(key: string): string | null {
  try {
    return typeof localStorage === 'undefined' ? null : localStorage.getItem(key);
  } catch {
    return null; // storage switched off: the defaults hold
  }
}
function write(key: string, value: string) {
  try {
    localStorage.setItem(key, value);
  } catch {
    // storage switched off: the choice lasts until the page is left
  }
  listeners.forEach((l) => l());
}
function subscribe(listener: () => void) {
  listeners.add(listener);
  const onStorage = (e: StorageEvent) => {
    if (e.key === KEYS.units || e.key === KEYS.theme) listener();
  };
  window.addEventListener('storage', onStorage);
  return () => {
    listeners.delete(listener);
    window.removeEventListener('storage', onStorage);
  };
}

const storedUnits = (): UnitSystem => {
  const v = read(KEYS.units);
  return (UNIT_SYSTEMS as readonly string[]).includes(v ?? '') ? (v as UnitSystem) : DEFAULT_UNITS;
};
export const storedTheme = (): ThemeChoice => {
  const v = read(KEYS.theme);
  return (THEMES as readonly string[]).includes(v ?? '') ? (v as ThemeChoice) : 'system';
};

/** Puts the theme choice on <html> (data-theme; "system" leaves it to prefers-color-scheme). */
export function applyTheme(choice: ThemeChoice = storedTheme()) {
  if (typeof document === 'undefined') return;
  const root = document.documentElement;
  if (choice === 'system') delete root.dataset.theme;
  else root.dataset.theme = choice;
}

/** The units figures are shown in: the account's for a member, this browser's for a visitor. */
export function useUnits(): UnitSystem {
  const me = useQuery(meQuery());
  const local = useSyncExternalStore(subscribe, storedUnits, () => DEFAULT_UNITS);
  return me.data?.units ?? local;
}

/** Changes the units: saved in the account for a member (and in this browser for after sign-out). */
export function useSetUnits() {
  const qc = useQueryClient();
  const me = useQuery(meQuery());
  return useCallback(
    async (units: UnitSystem) => {
      write(KEYS.units, units);
      const user = me.data;
      if (!user) return;
      // Shown at once; the account is updated behind it and put back if the server says no.
      const shown: User = { ...user, units };
      qc.setQueryData(meQuery().queryKey, shown);
      try {
        const saved = (await api.patch<Envelope<{ user: User }>>('/api/account', { units })).data.user;
        qc.setQueryData(meQuery().queryKey, saved);
      } catch (err) {
        qc.setQueryData(meQuery().queryKey, user);
        throw err;
      }
    },
    [qc, me.data],
  );
}

export function useTheme(): [ThemeChoice, (t: ThemeChoice) => void] {
  const theme = useSyncExternalStore(subscribe, storedTheme, () => 'system' as const);
  const set = useCallback((t: ThemeChoice) => {
    applyTheme(t); // first, so what listeners read next is already the new palette
    write(KEYS.theme, t);
  }, []);
  return [theme, set];
}

const DARK_QUERY = '(prefers-color-scheme: dark)';
function resolvedTheme(): 'light' | 'dark' {
  const t = document.documentElement.dataset.theme;
  if (t === 'light' || t === 'dark') return t;
  return window.matchMedia?.(DARK_QUERY).matches ? 'dark' : 'light';
}
function subscribeResolved(listener: () => void) {
  const off = subscribe(listener);
  const mq = window.matchMedia?.(DARK_QUERY);
  mq?.addEventListener('change', listener);
  return () => {
    off();
    mq?.removeEventListener('change', listener);
  };
}

/** The palette in use now, light or dark (the choice, or the system's when the choice is "system"). */
export function useResolvedTheme(): 'light' | 'dark' {
  return useSyncExternalStore(subscribeResolved, resolvedTheme, () => 'light' as const);
}

/**
 * Palette colours as literal values, for canvas (uPlot) and SVG (recharts) drawing, read from the CSS
 * variables of src/styles/index.css and read again when the palette changes. `names` are variable names
 * without the leading `--tw-` ("chart-1", "ink-soft").
 */
export function usePalette<K extends string>(names: readonly K[]): Record<K, string> {
  const theme = useResolvedTheme();
  const key = names.join(',');
  return useMemo(() => {
    const style = typeof document === 'undefined' ? null : getComputedStyle(document.documentElement);
    return Object.fromEntries(names.map((n) => [n, style?.getPropertyValue(`--tw-${n}`).trim() || '#888888'])) as Record<K, string>;
    // eslint-disable-next-line react-hooks/exhaustive-deps -- `key` stands for `names`; `theme` is why it is read again
  }, [key, theme]);
}
