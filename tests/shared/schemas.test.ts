import { describe, expect, it } from 'vitest';
import { signUpSchema, emailSchema, adminUserPatchSchema } from '../../shared/schemas/user';
import { guideContentSchema } from '../../shared/schemas/guide';
import { parameterContentSchema } from '../../shared/schemas/parameter';

describe('shared/schemas/user', () => {
  it('normalises e-mail addresses and refuses bad ones', () => {
    expect(emailSchema.parse('  Rosa@Tidewater.TEST ')).toBe('rosa@tidewater.test');
    expect(emailSchema.safeParse('rosa@').success).toBe(false);
    expect(emailSchema.safeParse(`${'a'.repeat(250)}@t.test`).success).toBe(false);
  });

  it('enforces 12–128 characters without composition rules', () => {
    const base = { email: 'a@b.test', displayName: 'Ab' };
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(11) }).success).toBe(false);
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(12) }).success).toBe(true);
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(128) }).success).toBe(true);
    expect(signUpSchema.safeParse({ ...base, password: 'a'.repeat(129) }).success).toBe(false);
  });

  it('needs a role or a disabled flag in an admin patch, and a reason for all but enabling', () => {
    expect(adminUserPatchSchema.safeParse({}).success).toBe(false);
    expect(adminUserPatchSchema.safeParse({ disabled: true, reason: 'Posting copied manuals' }).success).toBe(true);
    expect(adminUserPatchSchema.safeParse({ disabled: false }).success).toBe(true);
    expect(adminUserPatchSchema.safeParse({ disabled: true }).success).toBe(false);
    expect(adminUserPatchSchema.safeParse({ role: 'moderator' }).success).toBe(false);
    expect(adminUserPatchSchema.safeParse({ role: 'owner', reason: 'Runs the club nights' }).success).toBe(false);
  });
});

describe('content schemas', () => {
  it('accept a minimal guide and refuse an unknown class', () => {
    const guide = { title: 'Stock buggy on clay', summary: 'A baseline for clay.', class: 'buggy-2wd-stock', surface: 'clay', body: 'Text' };
    expect(guideContentSchema.parse(guide)).toMatchObject({ tags: [], parameters: [], conditions: '' });
    expect(guideContentSchema.safeParse({ ...guide, class: 'monster-truck' }).success).toBe(false);
  });

  it('refuse a parameter range whose max is below its min', () => {
    const p = { name: 'Drag brake', category: 'brake', range: { min: 10, max: 0, step: 1 }, summary: 'Braking at neutral throttle.', body: '' };
    const r = parameterContentSchema.safeParse(p);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0].path).toEqual(['range', 'max']);
  });
});
