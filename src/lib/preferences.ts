import { useCallback, useSyncExternalStore } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import type { User } from '@shared/schemas/user';
import { DEFAULT_UNITS, UNIT_SYSTEMS, type UnitSystem } from '@shared/units';
import { api, type Envelope } from '@/lib/api-client';
import { authQueries, useCurrentUser } from '@/features/auth/api/auth';

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
  const me = useCurrentUser();
  const local = useSyncExternalStore(subscribe, storedUnits, () => DEFAULT_UNITS);
  return me.data?.units ?? local;
}

/** Changes the units: saved in the account for a member (and in this browser for after sign-out). */
export function useSetUnits() {
  const qc = useQueryClient();
  const me = useCurrentUser();
  return useCallback(
    async (units: UnitSystem) => {
      write(KEYS.units, units);
      const user = me.data;
      if (!user) return;
      // Shown at once; the account is updated behind it and put back if the server says no.
      const shown: User = { ...user, units };
      qc.setQueryData(authQueries.me().queryKey, shown);
      try {
        const saved = (await api.patch<Envelope<{ user: User }>>('/api/account', { units })).data.user;
        qc.setQueryData(authQueries.me().queryKey, saved);
      } catch (err) {
        qc.setQueryData(authQueries.me().queryKey, user);
        throw err;
      }
    },
    [qc, me.data],
  );
}

export function useTheme(): [ThemeChoice, (t: ThemeChoice) => void] {
  const theme = useSyncExternalStore(subscribe, storedTheme, () => 'system' as const);
  const set = useCallback((t: ThemeChoice) => {
    write(KEYS.theme, t);
    applyTheme(t);
  }, []);
  return [theme, set];
}
