import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { siteCreateSchema, siteListQuerySchema, siteUpdateSchema } from '../../shared/schemas/site';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Node, Site, User } from '../models';
import { operatesAny } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayCreateSiteIn, siteAbilities, siteScope } from '../policies/site';
import { presentSite } from '../presenters/site';
import { countOf, InUse, uniquely } from '../services/conflicts';
import { filters, listPage } from '../services/listing';
import { assertHost, hostCandidates, readableNeighbourhood, readableSite } from '../services/references';

const duplicateName = (name: string) => `This neighbourhood already has a site named "${name}". Choose another name.`;

export function siteRoutes() {
  const router = Router();

  router.get('/', validate('query', siteListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const { rows, pagination } = await listPage(Site, q, {
      where: { ...siteScope(actor), ...filters({ neighbourhoodId: q.neighbourhoodId, hostUserId: q.hostUserId }) },
      sortable: ['name', 'neighbourhoodId', 'latitude', 'longitude', 'antennaHeightM', 'createdAt', 'id'],
      searchable: ['name', 'accessNotes'],
      defaultSort: 'name',
      include: [{ model: User, as: 'host' }],
    });
    res.json({
      data: rows.map((s) => presentSite(s, actor)),
      pagination,
      abilities: { create: operatesAny(actor) },
    });
  });

  router.post('/', validate('body', siteCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    await readableNeighbourhood(actor, body.neighbourhoodId);
    authorize(mayCreateSiteIn(actor, body.neighbourhoodId), 'Only admins and the operators of that neighbourhood add sites to it.');
    await assertHost(actor, body.hostUserId);
    const site = await uniquely(() => Site.create(body), duplicateName(body.name));
    res.status(201).json({ data: presentSite(await readableSite(actor, site.id), actor) });
  });

  // Who the caller may pick as a host: names only, for the site form's picker.
  router.get('/host-candidates', async (req, res) => {
    const actor = actorOf(req);
    authorize(operatesAny(actor), 'Only admins and operators choose hosts.');
    res.json({ data: (await hostCandidates(actor)).map((u) => ({ id: u.id, name: u.name })) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentSite(await readableSite(actor, res.locals.params.id), actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', siteUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const site = await readableSite(actor, res.locals.params.id);
    authorize(siteAbilities(actor, site).update, 'Only admins and the operators of its neighbourhood change this site.');
    const body = res.locals.body;
    if (body.neighbourhoodId !== undefined && body.neighbourhoodId !== site.neighbourhoodId) {
      await readableNeighbourhood(actor, body.neighbourhoodId);
      authorize(mayCreateSiteIn(actor, body.neighbourhoodId), 'You cannot move a site into a neighbourhood you do not operate.');
    }
    await assertHost(actor, body.hostUserId, site.hostUserId ?? null);
    await uniquely(() => site.update(body), duplicateName(body.name ?? site.name));
    res.json({ data: presentSite(await readableSite(actor, site.id), actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const site = await readableSite(actor, res.locals.params.id);
    authorize(siteAbilities(actor, site).delete, 'Only admins and the operators of its neighbourhood remove this site.');
    const nodeCount = await Node.count({ where: { siteId: site.id } });
    if (nodeCount) throw InUse(`This site still carries ${countOf(nodeCount, 'node')}. Move or remove its nodes first.`);
    await site.destroy();
    res.status(204).end();
  });

  return router;
}
