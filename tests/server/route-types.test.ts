import { describe, expect, expectTypeOf, it } from 'vitest';
import { defineRoute, type CallerFor } from '../../server/lib/route';
import type { User } from '../../shared/schemas/user';

// Checked by the typecheck that `npm test` runs first (tsc over tests/ too): a handler on a route
// whose access is a role gets a signed-in user without `!`; a public route's handler must handle nobody.
describe('route handler types', () => {
  it('give a role-guarded handler a non-null user and a public one a nullable user', () => {
    expectTypeOf<CallerFor<'member'>>().toEqualTypeOf<User>();
    expectTypeOf<CallerFor<'moderator'>>().toEqualTypeOf<User>();
    expectTypeOf<CallerFor<'public'>>().toEqualTypeOf<User | null>();
    const seen: string[] = [];
    const guarded = defineRoute({
      method: 'get',
      path: '/x',
      summary: 'x',
      tags: [],
      access: 'member',
      handler: ({ user }) => {
        seen.push(user.id);
      },
    });
    defineRoute({
      method: 'get',
      path: '/y',
      summary: 'y',
      tags: [],
      access: 'public',
      handler: ({ user }) => {
        // @ts-expect-error a public route's caller may be nobody
        seen.push(user.id);
      },
    });
    void guarded.handler({ user: { id: 'u1' } } as never);
    expect(seen).toEqual(['u1']);
  });
});
