/** Roles a signed-in account can hold; anyone signed out is a visitor. */
export const ROLES = ['member', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Roles in our words, for every screen and mail that names one (the stored values stay as they are). */
export const ROLE_LABELS: Record<Role, string> = { member: 'Member', moderator: 'Moderator', admin: 'Administrator' };

/** What each role may do, one line each (shown where an administrator changes a role). */
export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  member: 'can write guides, propose edits and keep a private notebook',
  moderator: 'can also review, publish, restore and hide content, and read the audit log',
  admin: 'can also change roles and disable accounts',
};

/** Rank of each role, so policies can ask "at least moderator". */
export const ROLE_RANK: Record<Role, number> = { member: 1, moderator: 2, admin: 3 };

/** Whether someone (or nobody) holds at least this role: the one rank check for server and client. */
export function hasRole(who: { role: Role } | null | undefined, min: Role): boolean {
  return !!who && ROLE_RANK[who.role] >= ROLE_RANK[min];
}

/** Revision states of guides and parameters (stored values; the UI shows our own words, see REVISION_STATE_LABELS). */
export const REVISION_STATES = ['draft', 'in_review', 'published', 'returned', 'archived'] as const;
export type RevisionState = (typeof REVISION_STATES)[number];

/** What readers see for each state. */
export const REVISION_STATE_LABELS: Record<RevisionState, string> = {
  draft: 'Workbench draft',
  in_review: 'Awaiting review',
  published: 'Live',
  returned: 'Sent back',
  archived: 'Superseded',
};

export const DOCUMENT_KINDS = ['guide', 'parameter'] as const;
export type DocumentKind = (typeof DOCUMENT_KINDS)[number];

/** Racing classes guides are written for. */
export const CLASSES = [
  { slug: 'buggy-2wd-stock', name: '1/10 2WD buggy, stock' },
  { slug: 'buggy-2wd-mod', name: '1/10 2WD buggy, modified' },
  { slug: 'buggy-4wd-mod', name: '1/10 4WD buggy, modified' },
  { slug: 'stadium-truck', name: '1/10 stadium truck' },
  { slug: 'short-course', name: '1/10 short-course truck' },
  { slug: 'touring-stock', name: '1/10 touring car, stock (zero-timing)' },
  { slug: 'touring-mod', name: '1/10 touring car, modified' },
  { slug: 'buggy-8th-e', name: '1/8 electric buggy' },
  { slug: 'oval', name: 'Oval' },
  { slug: 'drag', name: 'Drag' },
  { slug: 'crawler', name: 'Crawler' },
] as const;
export type ClassSlug = (typeof CLASSES)[number]['slug'];
export const CLASS_SLUGS = CLASSES.map((c) => c.slug) as [ClassSlug, ...ClassSlug[]];

/** Track surfaces. */
export const SURFACES = [
  { slug: 'clay', name: 'Clay' },
  { slug: 'carpet', name: 'Carpet' },
  { slug: 'astroturf', name: 'Astroturf' },
  { slug: 'asphalt', name: 'Asphalt' },
  { slug: 'loose-dirt', name: 'Loose dirt' },
] as const;
export type SurfaceSlug = (typeof SURFACES)[number]['slug'];
export const SURFACE_SLUGS = SURFACES.map((s) => s.slug) as [SurfaceSlug, ...SurfaceSlug[]];

/** Parameter categories, in the order the library shows them. */
export const PARAMETER_CATEGORIES = ['throttle', 'brake', 'timing', 'protection', 'power', 'motor', 'gearing', 'battery'] as const;
export type ParameterCategory = (typeof PARAMETER_CATEGORIES)[number];

export const LIMITS = {
  passwordMin: 12,
  passwordMax: 128,
  displayNameMax: 60,
  emailMax: 254,
  jsonBodyBytes: 512 * 1024,
  uploadBytes: 256 * 1024,
  searchQueryMax: 200,
  verifyTokenHours: 48,
  resetTokenMinutes: 60,
} as const;
