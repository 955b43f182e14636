import { z } from 'zod';
import { BANDS, CHANNEL_WIDTHS_MHZ, ENCRYPTIONS, POLARISATIONS, RADIO_ROLES } from '../enums';
import { channelProblem } from '../radio/channels';
import { idSchema, listQuerySchema, NO_BIDI } from './common';

const oneOf = (values: readonly string[]) => `must be one of ${values.join(', ')}`;

/** Every radio field, without defaults (see radioUpdateSchema for why). */
const radioFields = {
  nodeId: idSchema,
  iface: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9._-]{1,15}$/, 'must be an interface name like wlan0'),
  band: z.enum(BANDS, { error: oneOf(BANDS) }),
  channel: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(196, 'must be at most 196'),
  channelWidthMHz: z.union(CHANNEL_WIDTHS_MHZ.map((w) => z.literal(w)) as [z.ZodLiteral<20>, z.ZodLiteral<40>, z.ZodLiteral<80>], {
    error: `must be one of ${CHANNEL_WIDTHS_MHZ.join(', ')}`,
  }),
  txPowerDbm: z.number({ error: 'must be a number' }).min(-10, 'must be at least -10 dBm').max(36, 'must be at most 36 dBm'),
  antennaGainDbi: z.number({ error: 'must be a number' }).min(-10, 'must be at least -10 dBi').max(45, 'must be at most 45 dBi'),
  polarisation: z.enum(POLARISATIONS, { error: oneOf(POLARISATIONS) }),
  cableLossDb: z.number({ error: 'must be a number' }).min(0, 'must be 0 dB or more').max(30, 'must be at most 30 dB'),
  role: z.enum(RADIO_ROLES, { error: oneOf(RADIO_ROLES) }),
  ssid: z
    .string()
    .max(32, 'must be at most 32 bytes')
    .refine((s) => new TextEncoder().encode(s).length <= 32, 'must be at most 32 bytes')
    // eslint-disable-next-line no-control-regex -- control characters are what this check refuses
    .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'must not contain control characters')
    .refine((s) => !/[\u202a-\u202e\u2066-\u2069]/.test(s), NO_BIDI)
    .optional()
    .nullable(),
  encryption: z.enum(ENCRYPTIONS, { error: oneOf(ENCRYPTIONS) }),
  /** 8–63 printable ASCII or 64 hex digits (IEEE 802.11i). Write-only: never presented back. */
  preSharedKey: z
    .string()
    .refine((k) => /^[\x20-\x7e]{8,63}$/.test(k) || /^[0-9a-fA-F]{64}$/.test(k), 'must be 8–63 printable characters or 64 hex digits')
    .optional()
    .nullable(),
  groupRekeyS: z
    .number({ error: 'must be a number' })
    .int('must be a whole number of seconds')
    .min(0, 'must be 0 or more')
    .max(604800, 'must be at most one week'),
};

export const radioBaseSchema = z.object({
  ...radioFields,
  iface: radioFields.iface.default('wlan0'),
  polarisation: radioFields.polarisation.default('vertical'),
  cableLossDb: radioFields.cableLossDb.default(0),
  groupRekeyS: radioFields.groupRekeyS.default(600),
});

/**
 * Band, channel and width must agree (shared/radio/channels.ts channelProblem): on the IEEE 802.11 raster, a whole
 * bonding block, no 80 MHz on 2.4 GHz. A partial update is checked here with what it sends and in the route with
 * the stored values merged in.
 */
export function checkChannelFields(r: { band?: string; channel?: number; channelWidthMHz?: number }, ctx: z.RefinementCtx) {
  // Fields that failed their own check are reported there once, not again here.
  if ((r.band !== '2.4' && r.band !== '5') || !Number.isInteger(r.channel) || r.channel! < 1 || r.channel! > 196) return;
  if (r.channelWidthMHz !== undefined && ![20, 40, 80].includes(r.channelWidthMHz)) return;
  const problem = channelProblem(r.band, r.channel!, r.channelWidthMHz ?? 20);
  // A width that was not sent cannot be at fault; the route checks it against the stored one.
  if (!problem || (r.channelWidthMHz === undefined && problem.field === 'channelWidthMHz')) return;
  if (r.channelWidthMHz === undefined && problem.message.startsWith('cannot be used at')) return;
  ctx.addIssue({ code: 'custom', path: [problem.field], message: problem.message });
}

export const radioCreateSchema = radioBaseSchema.superRefine(checkChannelFields);
// Without defaults: zod fills defaults inside optional fields, which would reset what a partial update leaves out.
export const radioUpdateSchema = z.object(radioFields).partial().superRefine(checkChannelFields);
export const radioListQuerySchema = listQuerySchema.extend({
  nodeId: idSchema.optional(),
  band: z.enum(BANDS, { error: oneOf(BANDS) }).optional(),
  role: z.enum(RADIO_ROLES, { error: oneOf(RADIO_ROLES) }).optional(),
});

export type RadioCreate = z.infer<typeof radioCreateSchema>;

export interface RadioDto {
  id: number;
  nodeId: number;
  iface: string;
  band: (typeof BANDS)[number];
  channel: number;
  channelWidthMHz: number;
  txPowerDbm: number;
  antennaGainDbi: number;
  polarisation: string;
  cableLossDb: number;
  role: (typeof RADIO_ROLES)[number];
  ssid: string | null;
  encryption: (typeof ENCRYPTIONS)[number];
  hasPreSharedKey: boolean;
  groupRekeyS: number;
  /** The radio's own MAC from its node's reports; null until one is reported. */
  mac: string | null;
  macReportedAt: string | null;
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}

/** A radio's MAC that turned up on another node: a radio swapped between roofs. */
export interface RadioMove {
  id: number;
  mac: string;
  fromNodeId: number;
  fromNodeName: string;
  fromIface: string;
  toNodeId: number;
  toNodeName: string;
  toIface: string;
  at: string;
}
