import { type NextFunction, type Request, type Response, Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { Conflict, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { User } from '../models';
import { authorize } from '../policies/authorize';
import { domainEvents } from '../services/events';
import { mayListPeople, userAbilities } from '../policies/user';
import { presentUser } from '../presenters/user';
import { erasePerson, exportPerson } from '../services/personalData';

/** Mounted at /users/:id: a person's data, exported whole or erased (their network records stay, anonymised). */
export function personalDataRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  const guard = [
    (req: Request, _res: Response, next: NextFunction) => {
      authorize(mayListPeople(actorOf(req)), 'Only admins export or erase a person’s data.');
      next();
    },
    validate('params', idParamsSchema),
  ];

  const find = async (id: number) => {
    const user = await User.findByPk(id);
    if (!user) throw NotFound(`Person ${id}`);
    return user;
  };

  router.get('/export', ...guard, async (_req, res) => {
    const user = await find(res.locals.params.id);
    res.set('Content-Disposition', `attachment; filename="parapet-person-${user.id}.json"`);
    res.json({ data: await exportPerson(sequelize, user) });
  });

  router.post('/erase', ...guard, async (req, res) => {
    const actor = actorOf(req);
    const user = await find(res.locals.params.id);
    if (user.erasedAt) throw Conflict(`Person ${user.id}’s data was already erased.`, 'already_erased');
    authorize(userAbilities(actor, user).erase, 'You cannot erase your own account; ask another admin.');
    await erasePerson(sequelize, user, config.now());
    domainEvents.emit('access-changed', { userIds: [user.id] });
    res.json({ data: presentUser(user, [], actor) });
  });

  return router;
}
