import { z } from 'zod';
import { parseIpv4 } from '../addressing/cidr';
import { BANDS, CHANNEL_WIDTHS_MHZ, RADIO_ROLES } from '../enums';
import { isTimeZone } from '../time/monthRange';
import { idSchema, nameSchema } from './common';
import { cidrSchema } from './planning';
import { checkChannelFields } from './radio';

const oneOf = (values: readonly (string | number)[]) => `must be one of ${values.join(', ')}`;
const ipv4Schema = z
  .string({ error: 'must be an IPv4 address like 10.64.1.1' })
  .trim()
  .refine((t) => parseIpv4(t) !== null, 'must be an IPv4 address like 10.64.1.1 (four numbers 0–255, no leading zeros)');

/** Network settings an admin changes; every field optional. */
export const networkSettingsUpdateSchema = z
  .object({
    name: nameSchema,
    region: z.enum(['US', 'EU', 'JP'], { error: 'must be US, EU or JP' }),
    timeZone: z
      .string()
      .trim()
      .refine((tz) => tz !== '' && isTimeZone(tz), 'must be an IANA time zone like Europe/Lisbon'),
    addressPool: cidrSchema.nullable(),
  })
  .partial()
  .strict();
export type NetworkSettingsUpdate = z.infer<typeof networkSettingsUpdateSchema>;
export interface NetworkSettingsDto {
  name: string;
  region: 'US' | 'EU' | 'JP';
  timeZone: string;
  addressPool: string | null;
  updatedAt: string;
  abilities: { update: boolean };
}

/** One end of a link to save: an inventory radio, or a new radio on a node. */
const newRadioSchema = z
  .object({
    nodeId: idSchema,
    band: z.enum(BANDS, { error: oneOf(BANDS) }),
    channel: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(196, 'must be at most 196'),
    channelWidthMHz: z.union(CHANNEL_WIDTHS_MHZ.map((w) => z.literal(w)) as [z.ZodLiteral<20>, z.ZodLiteral<40>, z.ZodLiteral<80>], {
      error: oneOf(CHANNEL_WIDTHS_MHZ),
    }),
    txPowerDbm: z.number({ error: 'must be a number' }).min(-10, 'must be at least -10 dBm').max(36, 'must be at most 36 dBm'),
    antennaGainDbi: z.number({ error: 'must be a number' }).min(-10, 'must be at least -10 dBi').max(45, 'must be at most 45 dBi'),
    cableLossDb: z.number({ error: 'must be a number' }).min(0, 'must be 0 dB or more').max(30, 'must be at most 30 dB').default(0),
    role: z.enum(RADIO_ROLES, { error: oneOf(RADIO_ROLES) }).default('backhaul-ap'),
  })
  .superRefine(checkChannelFields);
const linkEndSchema = z.union([z.object({ radioId: idSchema }).strict(), newRadioSchema], {
  error: 'must name an inventory radio ({radioId}) or a new radio ({nodeId, band, channel, channelWidthMHz, txPowerDbm, antennaGainDbi})',
});
export const plannedLinkBodySchema = z.object({
  name: nameSchema.optional(),
  a: linkEndSchema,
  b: linkEndSchema,
});
export type PlannedLinkBody = z.infer<typeof plannedLinkBodySchema>;
export type PlannedLinkEnd = z.infer<typeof linkEndSchema>;

export const channelPlanQuerySchema = z.object({
  neighbourhoodId: idSchema.optional(),
  band: z.enum(BANDS, { error: oneOf(BANDS) }).optional(),
});

export const channelApplySchema = z.object({
  assignments: z
    .array(
      z.object({
        radioId: idSchema,
        channel: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(196, 'must be at most 196'),
      }),
    )
    .min(1, 'must list at least one radio')
    .max(500, 'may list at most 500 radios')
    .refine((list) => new Set(list.map((a) => a.radioId)).size === list.length, 'must list each radio once'),
});
export type ChannelApplyBody = z.infer<typeof channelApplySchema>;

export const nodeAddressPlanSchema = z
  .object({
    cidr: cidrSchema,
    gateway: ipv4Schema,
    dhcpStart: ipv4Schema.nullable().optional(),
    dhcpEnd: ipv4Schema.nullable().optional(),
    staticAddresses: z.array(ipv4Schema).max(256, 'may list at most 256 addresses').default([]),
  })
  .refine((p) => (p.dhcpStart == null) === (p.dhcpEnd == null), { message: 'give both dhcpStart and dhcpEnd, or neither', path: ['dhcpEnd'] });
export type NodeAddressPlanBody = z.infer<typeof nodeAddressPlanSchema>;

export const addressAllocateSchema = z.object({
  nodeIds: z.array(idSchema).min(1, 'must list at least one node').max(500, 'may list at most 500 nodes'),
  prefixLength: z.number({ error: 'must be a number' }).int('must be a whole number').min(16, 'must be /16 to /30').max(30, 'must be /16 to /30').default(24),
});
export type AddressAllocateBody = z.infer<typeof addressAllocateSchema>;

/** One node's subnet and DHCP range, as the address plan page reads it. */
export interface AddressPlanDto {
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  cidr: string;
  gateway: string;
  dhcpStart: string | null;
  dhcpEnd: string | null;
  staticAddresses: string[];
  abilities: { update: boolean; delete: boolean };
}
/** A plan-wide check's result; `code` says what kind (subnet_overlap, outside_pool, …) so callers never read the text. */
export interface AddressFindingDto {
  code: string;
  label: string;
  message: string;
}
export interface UnplannedNodeDto {
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  abilities: { allocate: boolean };
}
/** GET /api/address-plans */
export interface AddressPlansDto {
  pool: string | null;
  plans: AddressPlanDto[];
  findings: AddressFindingDto[];
  unplannedNodes: UnplannedNodeDto[];
}
