import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { toSafeCsv } from '../../shared/csv/csvSafe';
import { availabilityReportQuerySchema } from '../../shared/schemas/report';
import type { Config } from '../config';
import { requireRole } from '../middlewares/requireRole';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { isAdmin } from '../policies/actor';
import { availabilityReport } from '../services/availabilityReport';

/** Mounted at /reports: monthly figures for admins and operators (their neighbourhoods). */
export function reportRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();

  const gate = requireRole((actor) => isAdmin(actor) || actor.role === 'operator', 'Reports are for admins and operators.');
  router.get('/availability', gate, validate('query', availabilityReportQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const report = await availabilityReport(sequelize, actor, q.month, config.now());
    if (q.format === 'json') {
      res.json({ data: report });
      return;
    }
    const csv =
      q.table === 'outages'
        ? toSafeCsv(
            ['id', 'node', 'neighbourhood', 'startedAt', 'endedAt', 'acknowledgedAt', 'timeToAcknowledgeS', 'timeToRecoverS', 'downInMonthS'],
            report.outages,
          )
        : toSafeCsv(
            ['level', 'neighbourhood', 'node', 'availabilityPct', 'observedS', 'downS', 'outageCount'],
            [
              ...report.neighbourhoods.map((h) => ({ level: 'neighbourhood', neighbourhood: h.name, node: '', ...h })),
              ...report.nodes.map((n) => ({ level: 'node', node: n.name, ...n })),
            ],
          );
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="parapet-${q.table}-${q.month}.csv"`,
      'Cache-Control': 'no-store',
    });
    res.send(`\uFEFF${csv}\r\n`);
  });

  return router;
}
