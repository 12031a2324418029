import type { DocumentKind } from './constants';

/**
 * Every page's address, in one place: the router's route patterns, the server's page handlers and the
 * links in mail are all built from here, so a page that moves moves everywhere at once. Patterns use
 * the router's `:param` syntax; the builders encode what they put into a path or query.
 */
export const PAGE_PATTERNS = {
  home: '/',
  signIn: '/sign-in',
  signUp: '/sign-up',
  verify: '/verify',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  account: '/account',
  adminUsers: '/admin/users',
  audit: '/audit',
  parameters: '/parameters',
  parameter: '/parameters/:slug',
  parameterEdit: '/parameters/:slug/edit',
  calculators: '/calculators',
  calculator: '/calculators/:name',
  setups: '/setups',
  setupsCompare: '/setups/compare',
  setupsNew: '/setups/new',
  runs: '/runs',
  runsCompare: '/runs/compare',
  run: '/runs/:id',
  guides: '/guides',
  guideNew: '/guides/new',
  guide: '/guides/:slug',
  guideVersion: '/guides/:slug/v/:n',
  guideCompare: '/guides/:slug/compare',
  guideEdit: '/guides/:slug/edit',
  guideSetupPrint: '/guides/:slug/setup/print',
  workbench: '/me/revisions',
  reviewQueue: '/review',
  review: '/review/:revisionId',
  motors: '/motors',
  motor: '/motors/:id',
  motorPrint: '/motors/:id/print',
  search: '/search',
  unsubscribe: '/unsubscribe',
  changes: '/changes',
  devMail: '/dev/mail',
} as const;

export type PageName = keyof typeof PAGE_PATTERNS;

const seg = encodeURIComponent;

/** A document's reading page (guide or parameter entry). */
export const documentPath = (kind: DocumentKind, slug: string) => (kind === 'guide' ? `/guides/${seg(slug)}` : `/parameters/${seg(slug)}`);

export const paths = {
  guide: (slug: string) => documentPath('guide', slug),
  guideVersion: (slug: string, n: number) => `${documentPath('guide', slug)}/v/${n}`,
  documentVersion: (kind: DocumentKind, slug: string, n: number) => `${documentPath(kind, slug)}/v/${n}`,
  documentCompare: (kind: DocumentKind, slug: string, from: number, to: number) => `${documentPath(kind, slug)}/compare?from=${from}&to=${to}`,
  parameter: (slug: string) => documentPath('parameter', slug),
  /** The editor for one revision; a new guide has no live page to edit from. */
  editor: (kind: DocumentKind, slug: string, revisionId: string, isNew: boolean) =>
    kind === 'guide' && isNew ? `${PAGE_PATTERNS.guideNew}?draft=${seg(revisionId)}` : `${documentPath(kind, slug)}/edit?draft=${seg(revisionId)}`,
  review: (revisionId: string) => `/review/${seg(revisionId)}`,
  verify: (token: string) => `${PAGE_PATTERNS.verify}?token=${seg(token)}`,
  resetPassword: (token: string) => `${PAGE_PATTERNS.resetPassword}?token=${seg(token)}`,
  forgotPassword: () => PAGE_PATTERNS.forgotPassword,
  workbench: () => PAGE_PATTERNS.workbench,
  run: (id: string) => `/runs/${seg(id)}`,
  motor: (id: string) => `/motors/${seg(id)}`,
  search: (q: string) => `${PAGE_PATTERNS.search}?q=${seg(q)}`,
};

/** The router's form of a pattern: relative to the root route (no leading slash). */
export const routePath = (name: PageName) => PAGE_PATTERNS[name].slice(1);
