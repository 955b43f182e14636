import { QueryTypes, type Sequelize } from 'sequelize';
import type { Encryption, RadioRole } from '../../shared/enums';
import { reviewKeyReuse, reviewRadio, SEVERITY_ORDER, sortFindings, type SecurityFinding, type Severity } from '../../shared/security/review';
import { type Actor, mayManage } from '../policies/actor';

interface RadioRow {
  id: number;
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  iface: string;
  role: RadioRole;
  ssid: string | null;
  encryption: Encryption;
  preSharedKey: string | null;
  groupRekeyS: number;
}
type Finding = Pick<SecurityFinding, 'code' | 'severity' | 'message' | 'fix'>;
interface RadioLabel {
  radioId: number;
  nodeId: number;
  nodeName: string;
  iface: string;
  ssid: string | null;
}

export interface SecurityReview {
  counts: Record<Severity, number>;
  findings: (Finding & { radios: RadioLabel[] })[];
  radios: (Omit<RadioRow, 'id' | 'preSharedKey'> & { radioId: number; findings: Finding[] })[];
}

const strip = (f: SecurityFinding): Finding => ({ code: f.code, severity: f.severity, message: f.message, fix: f.fix });

/**
 * Findings per radio and network-wide, most severe first, for the radios the caller manages. Keys are read here to judge
 * them and never leave: findings say "weak" or "reused" without echoing the key.
 */
export async function securityReviewFor(sequelize: Sequelize, actor: Actor): Promise<SecurityReview> {
  const all = await sequelize.query<RadioRow>(
    `SELECT r.id, r.node_id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", r.iface, r.role, r.ssid,
            r.encryption, r.pre_shared_key AS "preSharedKey", r.group_rekey_s AS "groupRekeyS"
       FROM radios r JOIN nodes n ON n.id = r.node_id ORDER BY n.name, r.iface`,
    { type: QueryTypes.SELECT },
  );
  const mine = all.filter((r) => mayManage(actor, r.neighbourhoodId));
  const visible = new Set(mine.map((r) => r.id));
  const label = new Map(mine.map((r) => [r.id, { radioId: r.id, nodeId: r.nodeId, nodeName: r.nodeName, iface: r.iface, ssid: r.ssid }]));
  // Reuse is judged across the whole network; only the caller's radios are named in the answer.
  const reuse = reviewKeyReuse(all)
    .map((f) => ({ ...f, radioIds: f.radioIds?.filter((id) => visible.has(id)) }))
    .filter((f) => (f.radioIds?.length ?? 0) > 0);
  const radios = mine.map((r) => {
    const own = reviewRadio({ ...r, id: r.id });
    const reused = reuse.filter((f) => f.radioIds!.includes(r.id)).map((f) => ({ ...f, radioIds: [r.id] }));
    const findings = sortFindings([...own, ...reused]).map(strip);
    return {
      radioId: r.id,
      nodeId: r.nodeId,
      nodeName: r.nodeName,
      neighbourhoodId: r.neighbourhoodId,
      iface: r.iface,
      role: r.role,
      ssid: r.ssid,
      encryption: r.encryption,
      groupRekeyS: r.groupRekeyS,
      findings,
    };
  });
  const findings = sortFindings([...mine.flatMap((r) => reviewRadio({ ...r, id: r.id })), ...reuse]).map((f) => ({
    ...strip(f),
    radios: (f.radioIds ?? []).map((id) => label.get(id)!).filter(Boolean),
  }));
  const counts = Object.fromEntries(SEVERITY_ORDER.map((s) => [s, findings.filter((f) => f.severity === s).length])) as Record<Severity, number>;
  return { counts, findings, radios };
}
