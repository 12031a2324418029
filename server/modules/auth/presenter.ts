import type { AdminUser, User } from '../../../shared/schemas/user';
import type { UserEntity } from './user.entity';

export function presentUser(u: UserEntity): User {
  return { id: u.id, email: u.email, displayName: u.displayName, role: u.role, emailVerified: u.emailVerifiedAt !== null, units: u.units };
}

export function presentAdminUser(u: UserEntity): AdminUser {
  return { ...presentUser(u), disabled: u.disabledAt !== null, createdAt: u.createdAt.toISOString() };
}
