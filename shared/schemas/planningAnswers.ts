import type { Band, ChannelWidthMHz, Encryption, RadioRole } from '../enums';
import type { Severity } from '../security/review';

/** GET /planning/channel-plan: one row per radio the caller plans. */
export interface ChannelPlanRadioDto {
  radioId: number;
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  iface: string;
  band: Band;
  channelWidthMHz: ChannelWidthMHz;
  currentChannel: number;
  recommendedChannel: number | null;
  centerMHz: number | null;
  interferenceDbm: number | null;
  ownNodeOverlapMHz: number | null;
  changed: boolean;
}
export interface CongestionRowDto {
  channel: number;
  congestionDbm: number | null;
  networks: number;
}
export interface NodeCongestionDto {
  nodeId: number;
  nodeName: string;
  surveyId: number;
  surveyedAt: string;
  '2.4': CongestionRowDto[];
  '5': CongestionRowDto[];
}
export interface ChannelPlanDto {
  region: string;
  radios: ChannelPlanRadioDto[];
  skipped: { radioId: number; reason: string }[];
  congestion: NodeCongestionDto[];
}

/** POST /planning/channel-plan/apply. */
export interface ChannelApplyResultDto {
  updated: number;
  changes: { radioId: number; before: { channel: number }; after: { channel: number } }[];
}
/** GET /planning/channel-plan/history: the last 50 applied changes the caller may see (id is the bigint change id, as text). */
export interface ChannelPlanHistoryEntryDto {
  id: string;
  radioId: number;
  before: { channel: number };
  after: { channel: number };
  changedAt: string;
  changedBy: string | null;
}

/** GET/POST /nodes/:id/site-surveys. */
export interface SiteSurveyDto {
  id: number;
  nodeId: number;
  fileName: string | null;
  rowCount: number;
  rows: unknown[];
  uploadedBy: number | null;
  createdAt: string | null;
}
export interface SurveyUploadDto {
  data: SiteSurveyDto;
  rejectedRows: { line: number; message: string }[];
}

/** GET /security-review: keys never leave; findings say "weak" or "reused". */
export interface SecurityFindingDto {
  code: string;
  severity: Severity;
  message: string;
  fix: string;
}
export interface SecurityReviewRadioLabelDto {
  radioId: number;
  nodeId: number;
  nodeName: string;
  iface: string;
  ssid: string | null;
}
export interface SecurityReviewDto {
  counts: Record<Severity, number>;
  findings: (SecurityFindingDto & { radios: SecurityReviewRadioLabelDto[] })[];
  radios: {
    radioId: number;
    nodeId: number;
    nodeName: string;
    neighbourhoodId: number;
    iface: string;
    role: RadioRole;
    ssid: string | null;
    encryption: Encryption;
    groupRekeyS: number;
    findings: SecurityFindingDto[];
  }[];
}
