import { describe, expect, it } from 'vitest';
import { hasRole } from '../../shared/constants';

describe('hasRole', () => {
  it('ranks member < moderator < admin, and nobody holds any role', () => {
    expect(hasRole(null, 'member')).toBe(false);
    expect(hasRole(undefined, 'member')).toBe(false);
    expect(hasRole({ role: 'member' }, 'member')).toBe(true);
    expect(hasRole({ role: 'member' }, 'moderator')).toBe(false);
    expect(hasRole({ role: 'moderator' }, 'moderator')).toBe(true);
    expect(hasRole({ role: 'moderator' }, 'admin')).toBe(false);
    expect(hasRole({ role: 'admin' }, 'moderator')).toBe(true);
  });
});
