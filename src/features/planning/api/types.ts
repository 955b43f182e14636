import type { LinkBudgetAnswer } from '../../../../shared/radio/plan';
import type { RegulatoryAnswer } from '../../../../shared/radio/regulatory';
import type { Severity } from '../../../../shared/security/review';

export type { LinkBudgetAnswer, RegulatoryAnswer };
export type { NetworkSettingsDto } from '../../../../shared/schemas/planningRecords';

export interface ChannelPlanRadio {
  radioId: number; nodeId: number; nodeName: string; neighbourhoodId: number; iface: string; band: '2.4' | '5';
  channelWidthMHz: number; currentChannel: number; recommendedChannel: number | null; centerMHz: number | null;
  interferenceDbm: number | null; ownNodeOverlapMHz: number | null; changed: boolean;
}
export interface CongestionRow { channel: number; congestionDbm: number | null; networks: number }
export interface NodeCongestion { nodeId: number; nodeName: string; surveyId: number; surveyedAt: string; '2.4': CongestionRow[]; '5': CongestionRow[] }
export interface ChannelPlan { region: string; radios: ChannelPlanRadio[]; skipped: { radioId: number; reason: string }[]; congestion: NodeCongestion[] }
export interface SurveyUpload { data: { id: number; rowCount: number; fileName: string | null }; rejectedRows: { line: number; message: string }[] }

export type { AddressFindingDto } from '../../../../shared/schemas/planningRecords';
export type { AddressPlanDto as AddressPlanRow, AddressPlansDto as AddressPlans } from '../../../../shared/schemas/planningRecords';

export interface FindingDto { code: string; severity: Severity; message: string; fix: string }
export interface SecurityReview {
  counts: Record<Severity, number>;
  findings: (FindingDto & { radios: { radioId: number; nodeId: number; nodeName: string; iface: string; ssid: string | null }[] })[];
  radios: { radioId: number; nodeId: number; nodeName: string; iface: string; role: string; ssid: string | null; encryption: string; groupRekeyS: number; findings: FindingDto[] }[];
}

export interface LinkDirection {
  fromRadioId: number; toRadioId: number; toNodeId: number; toNodeName: string; predictedSignalDbm: number | null; measuredSignalDbm: number | null;
  measuredAt: string | null; baselineSignalDbm: number | null; baselineSamples: number; belowPredictionDb: number | null; belowBaselineDb: number | null; flagged: boolean;
}
export interface LinkHealthDto { linkId: number; name: string | null; status: string; baselineDays: number; flagged: boolean; directions: LinkDirection[] }

export interface ProvisioningRadio {
  id: number; iface: string; role: string; band: string; channel: number; centerMHz: number | null; channelWidthMHz: number; txPowerDbm: number;
  antennaGainDbi: number; cableLossDb: number; eirpDbm: number; polarisation: string; ssid: string | null; encryption: string; groupRekeyS: number;
  hasPreSharedKey: boolean; preSharedKey?: string | null;
}
export interface ProvisioningSheet {
  node: { id: number; name: string; hardware: string | null; firmware: string | null; managementAddress: string | null; reportIntervalS: number };
  site: { id: number; name: string; latitude: number; longitude: number; antennaHeightM: number };
  region: string; timeZone: string;
  addresses: { cidr: string; netmask: string; gateway: string; broadcast: string | null; dhcpStart: string | null; dhcpEnd: string | null; staticAddresses: string[] } | null;
  radios: ProvisioningRadio[];
  agent: { scriptPath: string; reportPath: string };
  abilities: { readKeys: boolean; issueToken: boolean };
}
