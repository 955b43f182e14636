import type {
  ChannelApplyResultDto,
  ChannelPlanHistoryEntryDto,
  SecurityFindingDto,
  SecurityReviewDto,
  SiteSurveyDto,
} from '../../shared/schemas/planningAnswers';
import type { ChangeRecord } from '../services/changeHistory';
import type { ChannelPlanHistoryRow } from '../services/channelPlanning';
import type { SecurityReview } from '../services/securityReview';
import type { SiteSurveyRow } from '../services/siteSurveys';
import { iso } from './common';

type ChannelChange = Pick<ChangeRecord, 'recordId' | 'before' | 'after'>;

export function presentChannelApply(changes: ChannelChange[]): ChannelApplyResultDto {
  return {
    updated: changes.length,
    changes: changes.map((c) => ({ radioId: Number(c.recordId), before: c.before as { channel: number }, after: c.after as { channel: number } })),
  };
}

export const presentChannelHistoryEntry = (h: ChannelPlanHistoryRow): ChannelPlanHistoryEntryDto => ({
  id: h.id,
  radioId: h.radioId,
  before: h.before,
  after: h.after,
  changedAt: iso(h.changedAt)!,
  changedBy: h.changedBy,
});

export const presentSiteSurvey = (s: SiteSurveyRow): SiteSurveyDto => ({
  id: s.id,
  nodeId: s.nodeId,
  fileName: s.fileName,
  rowCount: s.rowCount,
  rows: s.rows,
  uploadedBy: s.uploadedBy,
  createdAt: iso(s.createdAt),
});

/** The review is assembled key-free by the service; this lists the fields that leave. */
export function presentSecurityReview(review: SecurityReview): SecurityReviewDto {
  const finding = (f: SecurityFindingDto): SecurityFindingDto => ({ code: f.code, severity: f.severity, message: f.message, fix: f.fix });
  return {
    counts: review.counts,
    findings: review.findings.map((f) => ({
      ...finding(f),
      radios: f.radios.map((r) => ({ radioId: r.radioId, nodeId: r.nodeId, nodeName: r.nodeName, iface: r.iface, ssid: r.ssid })),
    })),
    radios: review.radios.map((r) => ({
      radioId: r.radioId,
      nodeId: r.nodeId,
      nodeName: r.nodeName,
      neighbourhoodId: r.neighbourhoodId,
      iface: r.iface,
      role: r.role,
      ssid: r.ssid,
      encryption: r.encryption,
      groupRekeyS: r.groupRekeyS,
      findings: r.findings.map(finding),
    })),
  };
}
