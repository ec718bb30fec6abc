import { Router } from 'express';
import type { DataSource } from 'typeorm';
import { isRole } from '../../../shared/api/roles.ts';
import { AppError } from '../../http/app-error.ts';
import { currentUser, requireRole } from '../../http/guards.ts';
import { parsePaging } from '../../http/paging.ts';
import { parseBody } from '../../http/validate.ts';
import { CreateUserDto } from './create-user.dto.ts';
import { UpdateUserDto } from './update-user.dto.ts';
import { createUser, listUsers, updateUser, type UserSort } from './users.service.ts';

const SORTS: UserSort[] = ['name', 'email', 'role', 'createdAt'];

/** User management: quality engineers only. Users are never deleted (the audit trail keeps names). */
export function usersRouter(ds: DataSource): Router {
  const r = Router();
  r.use(requireRole('quality'));

  r.get('/', async (req, res) => {
    const { page, pageSize } = parsePaging(req.query);
    const q = req.query;
    if (q.role !== undefined && !isRole(q.role)) throw AppError.badRequest('Unknown role.', [{ field: 'role', message: 'unknown role' }]);
    if (q.sort !== undefined && !SORTS.includes(q.sort as UserSort)) {
      throw AppError.badRequest('Unknown sort.', [{ field: 'sort', message: `sort must be one of ${SORTS.join(', ')}` }]);
    }
    res.json(
      await listUsers(ds, {
        page,
        pageSize,
        search: typeof q.search === 'string' && q.search.trim() ? q.search.trim() : undefined,
        role: q.role as string | undefined,
        sort: q.sort as UserSort | undefined,
        dir: q.dir === 'desc' ? 'desc' : 'asc',
      }),
    );
  });

  r.post('/', async (req, res) => {
    const dto = await parseBody(CreateUserDto, req.body);
    res.status(201).json(await createUser(ds, currentUser(req), dto));
  });

  r.patch('/:id', async (req, res) => {
    const id = Number(req.params.id);
    if (!Number.isInteger(id) || id < 1) throw AppError.badRequest('The user id must be a positive whole number.', [{ field: 'id', message: 'invalid id' }]);
    const dto = await parseBody(UpdateUserDto, req.body);
    if (Object.keys(dto).length === 0) throw AppError.badRequest('Nothing to change: send name, role or active.');
    res.json(await updateUser(ds, currentUser(req), id, dto));
  });

  return r;
}
