import { Brackets } from 'typeorm';
import type { Role } from '../../../shared/constants';
import { AppError, notFound } from '../../lib/errors';
import type { AppContext } from '../../context';
import { UserEntity } from '../auth/user.entity';
import { AuditLogEntity } from '../audit/audit-log.entity';
import { endSessions } from '../auth/service';
import { LIBRARY_EMAIL } from '../../db/seed-content';

export function adminService(ctx: AppContext) {
  return {
    async listUsers(q: { q?: string; role?: Role; page: number; pageSize: number }) {
      // The seeded library's authoring account is not a person; it is not listed.
      const qb = ctx.dataSource.getRepository(UserEntity).createQueryBuilder('u').where('u.email <> :library', { library: LIBRARY_EMAIL });
      // A deleted account is a name on old versions, not a person to manage (#16).
      qb.andWhere('u.deletedAt IS NULL');
      if (q.q) {
        const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`).toLowerCase()}%`;
        qb.andWhere(new Brackets((w) => w.where('u.email LIKE :like', { like }).orWhere('lower(u.displayName) LIKE :like', { like })));
      }
      if (q.role) qb.andWhere('u.role = :role', { role: q.role });
      const [rows, total] = await qb
        .orderBy('u.createdAt', 'ASC')
        .skip((q.page - 1) * q.pageSize)
        .take(q.pageSize)
        .getManyAndCount();
      return { rows, total };
    },

    /** Changes role and/or disabled state in one transaction, with an audit row for each change. */
    async updateUser(actorId: string, id: string, patch: { role?: Role; disabled?: boolean; reason?: string }) {
      if (id === actorId)
        throw new AppError(409, 'cannot_change_self', 'You cannot change your own role or disable your own account. Ask another administrator.');
      return ctx.dataSource.transaction(async (m) => {
        const repo = m.getRepository(UserEntity);
        const user = await repo.createQueryBuilder('u').where('u.id = :id', { id }).setLock('pessimistic_write').getOne();
        if (!user || user.deletedAt) throw notFound('That account');
        const audit = m.getRepository(AuditLogEntity);
        if (patch.role && patch.role !== user.role) {
          await audit.insert({
            actorId,
            action: 'user.role',
            subjectKind: 'user',
            subjectId: id,
            from: user.role,
            to: patch.role,
            reason: patch.reason ?? null,
            meta: {},
          });
          user.role = patch.role;
        }
        if (patch.disabled !== undefined && patch.disabled !== (user.disabledAt !== null)) {
          await audit.insert({
            actorId,
            action: patch.disabled ? 'user.disable' : 'user.enable',
            subjectKind: 'user',
            subjectId: id,
            from: user.disabledAt ? 'disabled' : 'active',
            to: patch.disabled ? 'disabled' : 'active',
            reason: patch.reason ?? null,
            meta: {},
          });
          user.disabledAt = patch.disabled ? new Date() : null;
          if (patch.disabled) await endSessions(m, id);
        }
        return repo.save(user);
      });
    },
  };
}
