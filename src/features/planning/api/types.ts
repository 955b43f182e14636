import type { LinkBudgetAnswer } from '../../../../shared/radio/plan';
import type { RegulatoryAnswer } from '../../../../shared/radio/regulatory';

export type { LinkBudgetAnswer, RegulatoryAnswer };
export type { NetworkSettingsDto } from '../../../../shared/schemas/planningRecords';

export type {
  ChannelPlanDto as ChannelPlan,
  ChannelPlanRadioDto as ChannelPlanRadio,
  CongestionRowDto as CongestionRow,
  NodeCongestionDto as NodeCongestion,
  ChannelApplyResultDto,
  ChannelPlanHistoryEntryDto,
  SurveyUploadDto as SurveyUpload,
} from '../../../../shared/schemas/planningAnswers';

export type { AddressFindingDto } from '../../../../shared/schemas/planningRecords';
export type { AddressPlanDto as AddressPlanRow, AddressPlansDto as AddressPlans } from '../../../../shared/schemas/planningRecords';

export type { SecurityFindingDto as FindingDto, SecurityReviewDto as SecurityReview } from '../../../../shared/schemas/planningAnswers';

export interface LinkDirection {
  fromRadioId: number;
  toRadioId: number;
  toNodeId: number;
  toNodeName: string;
  predictedSignalDbm: number | null;
  measuredSignalDbm: number | null;
  measuredAt: string | null;
  baselineSignalDbm: number | null;
  baselineSamples: number;
  belowPredictionDb: number | null;
  belowBaselineDb: number | null;
  flagged: boolean;
}
export interface LinkHealthDto {
  linkId: number;
  name: string | null;
  status: string;
  baselineDays: number;
  flagged: boolean;
  directions: LinkDirection[];
}

export interface ProvisioningRadio {
  id: number;
  iface: string;
  role: string;
  band: string;
  channel: number;
  centerMHz: number | null;
  channelWidthMHz: number;
  txPowerDbm: number;
  antennaGainDbi: number;
  cableLossDb: number;
  eirpDbm: number;
  polarisation: string;
  ssid: string | null;
  encryption: string;
  groupRekeyS: number;
  hasPreSharedKey: boolean;
  preSharedKey?: string | null;
}
export interface ProvisioningSheet {
  node: { id: number; name: string; hardware: string | null; firmware: string | null; managementAddress: string | null; reportIntervalS: number };
  site: { id: number; name: string; latitude: number; longitude: number; antennaHeightM: number };
  region: string;
  timeZone: string;
  addresses: {
    cidr: string;
    netmask: string;
    gateway: string;
    broadcast: string | null;
    dhcpStart: string | null;
    dhcpEnd: string | null;
    staticAddresses: string[];
  } | null;
  radios: ProvisioningRadio[];
  agent: { scriptPath: string; reportPath: string };
  abilities: { readKeys: boolean; issueToken: boolean };
}
