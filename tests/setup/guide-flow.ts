import type { RouteDef } from '../../server/lib/route';
import type { HttpClient, HttpResponse } from './http-client';

/**
 * The writing journey of a guide through the API (create a draft, autosave, submit, publish), for
 * the load run and the scale-out test. Each step names the route it needs, so callers can tell
 * from the route table whether the journey is possible yet and skip it with a note when it is not.
 */
export const GUIDE_ROUTES = {
  read: ['get', '/api/guides/:slug'],
  create: ['post', '/api/guides'],
  autosave: ['patch', '/api/revisions/:id'],
  submit: ['post', '/api/revisions/:id/submit'],
  publish: ['post', '/api/reviews/:revisionId/publish'],
  propose: ['post', '/api/guides/:slug/revisions'],
} as const;
export type GuideStep = keyof typeof GUIDE_ROUTES;

export function hasRoute(routes: RouteDef[], method: string, path: string) {
  return routes.some((r) => r.method === method && r.path === path);
}

/** The steps of GUIDE_ROUTES whose routes are not in the table. */
export function missingGuideSteps(routes: RouteDef[], steps: GuideStep[]) {
  return steps.filter((s) => !hasRoute(routes, GUIDE_ROUTES[s][0], GUIDE_ROUTES[s][1]));
}

type RevisionData = { data: { revision: { id: string; number: number; state: string; content: Record<string, unknown> }; guide?: { slug: string } } };

function expectOk(res: HttpResponse, what: string): RevisionData {
  if (res.status < 200 || res.status >= 300) throw new Error(`${what} answered ${res.status}: ${res.text.slice(0, 300)}`);
  return res.body as RevisionData;
}

/** A new guide draft with a unique title; returns what was sent and what the API answered. */
export async function createGuideDraft(client: HttpClient, tag: string) {
  const content = {
    title: `Harbour Flats clay baseline ${tag}`,
    summary: `A starting point for the Tidewater RC Club stock buggy class, run ${tag}.`,
    class: 'buggy-2wd-stock',
    surface: 'clay',
    body: `## Starting point\n\nPunch low, drag brake light. Draft ${tag}.\n`,
  };
  const res = await client.post(GUIDE_ROUTES.create[1], content);
  const body = expectOk(res, `POST ${GUIDE_ROUTES.create[1]}`);
  return { res, content, revisionId: body.data.revision.id, slug: body.data.guide?.slug ?? (body.data.revision as { slug?: string }).slug ?? '' };
}

export const autosaveDraft = (client: HttpClient, revisionId: string, fields: Record<string, unknown>) =>
  client.patch(GUIDE_ROUTES.autosave[1].replace(':id', revisionId), fields);
export const submitDraft = (client: HttpClient, revisionId: string, note: string) => client.post(GUIDE_ROUTES.submit[1].replace(':id', revisionId), { note });
export const publishRevision = (client: HttpClient, revisionId: string) => client.post(GUIDE_ROUTES.publish[1].replace(':revisionId', revisionId));
export const proposeGuideEdit = (client: HttpClient, slug: string, baseRevisionId: string, fields: Record<string, unknown>) =>
  client.post(GUIDE_ROUTES.propose[1].replace(':slug', slug), { ...fields, baseRevisionId });
export const readGuide = (client: HttpClient, slug: string) => client.get(GUIDE_ROUTES.read[1].replace(':slug', slug));
export { expectOk };
