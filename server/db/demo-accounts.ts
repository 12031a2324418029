import type { Role } from '../../shared/constants';

/** Invented demo accounts of the Tidewater RC Club (local demo only; never seeded in production). */
export const DEMO_ACCOUNTS: Array<{ key: string; email: string; displayName: string; role: Role; password: string; printed: boolean }> = [
  { key: 'nell', email: 'nell@tidewater.test', displayName: 'Nell Harrowgate', role: 'admin', password: 'harbour-admin-lantern-77', printed: true },
  { key: 'owen', email: 'owen@tidewater.test', displayName: 'Owen Saltmarsh', role: 'moderator', password: 'marshal-tower-tidewater-5', printed: true },
  { key: 'rosa', email: 'rosa@tidewater.test', displayName: 'Rosa Kittering', role: 'member', password: 'clay-groove-pinion-31', printed: true },
  { key: 'jonah', email: 'jonah@tidewater.test', displayName: 'Jonah Brightwell', role: 'member', password: 'spur-gear-driftwood-48', printed: true },
  { key: 'priya', email: 'priya@tidewater.test', displayName: 'Priya Lockhart', role: 'moderator', password: 'harbour-flats-stopwatch-9', printed: false },
  { key: 'mira', email: 'mira@tidewater.test', displayName: 'Mira Quillon', role: 'member', password: 'saltings-meadow-rutter-6', printed: false },
  { key: 'calum', email: 'calum@tidewater.test', displayName: 'Calum Fenwick', role: 'member', password: 'carpet-oval-lapcount-22', printed: false },
];
