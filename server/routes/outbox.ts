import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { outboxListQuerySchema } from '../../shared/schemas/alerts';
import type { Config } from '../config';
import { Conflict, NotFound } from '../errors';
import { requireRole } from '../middlewares/requireRole';
import { validate } from '../middlewares/validate';
import { OutboxMessage } from '../models';
import { isAdmin } from '../policies/actor';
import { presentOutboxMessage } from '../presenters/alerts';
import { filters, listPage } from '../services/listing';

const ADMINS_ONLY = 'Only admins see the outbox: it holds everyone’s mail.';

/** The outgoing mail, for admins: what was written, to whom, and whether it went out; failed mail can be retried. */
export function outboxRoutes(config: Config) {
  const router = Router();
  router.use(requireRole(isAdmin, ADMINS_ONLY));

  router.get('/', validate('query', outboxListQuerySchema), async (req, res) => {
    const q = res.locals.query;
    const { rows, pagination } = await listPage(OutboxMessage, q, {
      where: filters({ status: q.status, kind: q.kind }),
      sortable: ['createdAt', 'sentAt', 'nextAttemptAt', 'attempts', 'id'],
      searchable: ['subject', 'recipientAddress'],
      defaultSort: '-createdAt',
    });
    res.json({ data: rows.map(presentOutboxMessage), pagination });
  });

  router.post('/:id/retry', validate('params', idParamsSchema), async (req, res) => {
    const message = await OutboxMessage.findByPk(res.locals.params.id);
    if (!message) throw NotFound(`Outbox message ${res.locals.params.id}`);
    if (message.status !== 'failed') {
      throw Conflict(`Only failed messages can be retried; this one is ${message.status}.`, 'not_failed');
    }
    // A fresh set of attempts from now; the dedupe key and Message-ID stay, so it still goes out once.
    await message.update({ status: 'pending', attempts: 0, nextAttemptAt: config.now(), lastError: null });
    res.json({ data: presentOutboxMessage(message) });
  });

  return router;
}
