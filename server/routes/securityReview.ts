import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Encryption, RadioRole } from '../../shared/enums';
import { reviewKeyReuse, reviewRadio, SEVERITY_ORDER, sortFindings, type SecurityFinding, type Severity } from '../../shared/security/review';
import { actorOf } from '../middlewares/requireUser';
import { type Actor, isAdmin } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';

interface RadioRow { id: number; nodeId: number; nodeName: string; neighbourhoodId: number; iface: string; role: RadioRole; ssid: string | null; encryption: Encryption; preSharedKey: string | null; groupRekeyS: number }

const mayReview = (actor: Actor, r: RadioRow) => isAdmin(actor) || actor.neighbourhoodIds.includes(r.neighbourhoodId);

/**
 * Findings per radio and network-wide, most severe first. Keys are read here to judge them and never leave:
 * findings say "weak" or "reused" without echoing the key.
 */
export function securityReviewRoutes(sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    authorize(mayPlan(actor), 'The security review is for operators and admins.');
    const all = await sequelize.query<RadioRow>(
      `SELECT r.id, r.node_id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", r.iface, r.role, r.ssid,
              r.encryption, r.pre_shared_key AS "preSharedKey", r.group_rekey_s AS "groupRekeyS"
         FROM radios r JOIN nodes n ON n.id = r.node_id ORDER BY n.name, r.iface`,
      { type: QueryTypes.SELECT },
    );
    const mine = all.filter((r) => mayReview(actor, r));
    const visible = new Set(mine.map((r) => r.id));
    const label = new Map(mine.map((r) => [r.id, { radioId: r.id, nodeId: r.nodeId, nodeName: r.nodeName, iface: r.iface, ssid: r.ssid }]));
    // Reuse is judged across the whole network; only the caller's radios are named in the answer.
    const reuse = reviewKeyReuse(all).map((f) => ({ ...f, radioIds: f.radioIds?.filter((id) => visible.has(id)) })).filter((f) => (f.radioIds?.length ?? 0) > 0);
    const perRadio = mine.map((r) => {
      const own = reviewRadio({ ...r, id: r.id });
      const reused = reuse.filter((f) => f.radioIds!.includes(r.id)).map((f) => ({ ...f, radioIds: [r.id] }));
      const findings = sortFindings([...own, ...reused]).map(strip);
      return { radioId: r.id, nodeId: r.nodeId, nodeName: r.nodeName, neighbourhoodId: r.neighbourhoodId, iface: r.iface, role: r.role, ssid: r.ssid, encryption: r.encryption, groupRekeyS: r.groupRekeyS, findings };
    });
    const network = sortFindings([...mine.flatMap((r) => reviewRadio({ ...r, id: r.id })), ...reuse]).map((f) => ({
      ...strip(f), radios: (f.radioIds ?? []).map((id) => label.get(id)!).filter(Boolean),
    }));
    const counts = Object.fromEntries(SEVERITY_ORDER.map((s) => [s, network.filter((f) => f.severity === s).length])) as Record<Severity, number>;
    res.json({ data: { counts, findings: network, radios: perRadio } });
  });
  return router;
}

const strip = (f: SecurityFinding) => ({ code: f.code, severity: f.severity, message: f.message, fix: f.fix });
