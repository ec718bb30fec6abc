import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../../shared/api/auth.ts';
import type { CreateUserRequest, Page, UpdateUserRequest, UserRow } from '../../../shared/api/users.ts';
import { AppError } from '../../http/app-error.ts';
import { recordAudit } from '../audit/audit.service.ts';
import { dummyHash, hashPassword, verifyPassword } from '../auth/password.ts';
import { forgetCachedUser } from './active-user-cache.ts';
import { User } from './user.entity.ts';

export function toSessionUser(u: User): SessionUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

function toRow(u: User): UserRow {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    active: u.active,
    createdAt: u.createdAt.toISOString(),
    updatedAt: u.updatedAt.toISOString(),
  };
}

/** The audit view of a user: never the password hash. */
function auditView(u: User) {
  return { email: u.email, name: u.name, role: u.role, active: u.active };
}

const normaliseEmail = (e: string) => e.trim().toLowerCase();

/** Checks a sign-in. Same work and same answer whether or not the e-mail exists. */
export async function authenticate(ds: DataSource, email: string, password: string): Promise<SessionUser | null> {
  const user = await ds.getRepository(User).findOneBy({ email: normaliseEmail(email) });
  const ok = await verifyPassword(password, user?.passwordHash ?? (await dummyHash()));
  if (!user || !ok || !user.active) return null;
  return toSessionUser(user);
}

export async function findActiveUser(ds: DataSource, id: number): Promise<SessionUser | null> {
  const user = await ds.getRepository(User).findOneBy({ id, active: true });
  return user ? toSessionUser(user) : null;
}

export type UserSort = 'name' | 'email' | 'role' | 'createdAt';

export async function listUsers(
  ds: DataSource,
  q: { page: number; pageSize: number; search?: string; role?: string; sort?: UserSort; dir?: 'asc' | 'desc' },
): Promise<Page<UserRow>> {
  const qb = ds.getRepository(User).createQueryBuilder('u');
  if (q.search) qb.andWhere('(u.name ILIKE :s OR u.email ILIKE :s)', { s: `%${q.search.replace(/[%_]/g, '\\$&')}%` });
  if (q.role) qb.andWhere('u.role = :role', { role: q.role });
  const sortCol = { name: 'u.name', email: 'u.email', role: 'u.role', createdAt: 'u.createdAt' }[q.sort ?? 'name'];
  qb.orderBy(sortCol, (q.dir ?? 'asc').toUpperCase() as 'ASC' | 'DESC').addOrderBy('u.id', 'ASC');
  const [rows, total] = await qb.skip((q.page - 1) * q.pageSize).take(q.pageSize).getManyAndCount();
  return { items: rows.map(toRow), total, page: q.page, pageSize: q.pageSize };
}

export async function createUser(ds: DataSource, actor: SessionUser | null, input: CreateUserRequest): Promise<UserRow> {
  const email = normaliseEmail(input.email);
  const passwordHash = await hashPassword(input.password);
  return ds.transaction(async (m) => {
    if (await m.findOneBy(User, { email })) {
      throw AppError.conflict('A user with this e-mail already exists.', [{ field: 'email', message: 'already in use' }]);
    }
    const saved = await m.save(m.create(User, { email, name: input.name.trim(), role: input.role, passwordHash, active: true }));
    await recordAudit(m, { actor, action: 'user.create', entityType: 'user', entityId: saved.id, after: auditView(saved) });
    return toRow(saved);
  });
}

export async function updateUser(ds: DataSource, actor: SessionUser, id: number, input: UpdateUserRequest): Promise<UserRow> {
  try {
    return await updateUserRow(ds, actor, id, input);
  } finally {
    // Passport keeps signed-in users in a short cache (active-user-cache.ts): a role change or a
    // deactivation takes effect at this process's next request of that user.
    forgetCachedUser(ds, id);
  }
}

async function updateUserRow(ds: DataSource, actor: SessionUser, id: number, input: UpdateUserRequest): Promise<UserRow> {
  return ds.transaction(async (m) => {
    const user = await m.findOne(User, { where: { id }, lock: { mode: 'pessimistic_write' } });
    if (!user) throw AppError.notFound(`User ${id}`);
    if (user.id === actor.id && (input.active === false || (input.role && input.role !== user.role))) {
      throw AppError.conflict('You cannot change your own role or deactivate yourself; ask another quality engineer.');
    }
    const before = auditView(user);
    if (input.name !== undefined) user.name = input.name.trim();
    if (input.role !== undefined) user.role = input.role;
    if (input.active !== undefined) user.active = input.active;
    const saved = await m.save(user);
    const action = input.active === false && before.active ? 'user.deactivate' : input.active === true && !before.active ? 'user.reactivate' : 'user.update';
    await recordAudit(m, { actor, action, entityType: 'user', entityId: id, before, after: auditView(saved) });
    return toRow(saved);
  });
}
