import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { userCreateSchema, userListQuerySchema, userUpdateSchema } from '../../shared/schemas/user';
import type { Config } from '../config';
import { Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { User } from '../models';
import { authorize } from '../policies/authorize';
import { mayListPeople, userAbilities } from '../policies/user';
import { presentUser } from '../presenters/user';
import { assertPasswordFor } from '../services/accountLinks';
import { filters, listPage } from '../services/listing';
import { assignmentsOf, createPerson, findPerson, removePerson, updatePerson } from '../services/people';

/** People are the admins' to manage; other roles only ever see themselves through the session. */
export function userRoutes(config: Config) {
  const router = Router();

  router.use((req, _res, next) => {
    authorize(mayListPeople(actorOf(req)), 'Only admins manage people.');
    next();
  });

  router.get('/', validate('query', userListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const { rows, pagination } = await listPage(User, q, {
      where: filters({ role: q.role }),
      sortable: ['name', 'email', 'role', 'createdAt', 'id'],
      searchable: ['name', 'email'],
      defaultSort: 'name',
    });
    const assigned = await assignmentsOf(rows.map((u) => u.id));
    res.json({ data: rows.map((u) => presentUser(u, assigned(u.id), actor)), pagination, abilities: { create: true } });
  });

  router.post('/', validate('body', userCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const { password, ...rest } = res.locals.body;
    // The same checks as a password people choose themselves: not their own name or address, not the demo's.
    assertPasswordFor(config, rest, password, 'password');
    const user = await createPerson(rest, password);
    res.status(201).json({ data: presentUser(user, [], actor) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const user = await findPerson(res.locals.params.id);
    res.json({ data: presentUser(user, (await assignmentsOf([user.id]))(user.id), actorOf(req)) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', userUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const user = await findPerson(res.locals.params.id);
    const body = res.locals.body;
    if (user.id === actor.id && ((body.role && body.role !== 'admin') || body.active === false)) {
      throw Invalid('You cannot remove your own admin role or deactivate yourself; ask another admin.');
    }
    await updatePerson(user, body);
    res.json({ data: presentUser(user, (await assignmentsOf([user.id]))(user.id), actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const user = await findPerson(res.locals.params.id);
    authorize(userAbilities(actor, user).delete, 'You cannot remove your own account.');
    await removePerson(user);
    res.status(204).end();
  });

  return router;
}
