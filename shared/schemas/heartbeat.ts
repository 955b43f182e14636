import { z } from 'zod';
import { BANDS, CHANNEL_WIDTHS_MHZ, RADIO_ROLES } from '../enums';

// z.number() already refuses NaN and Infinity; ranges are physical limits, not policy.
const finite = (min: number, max: number, unit: string) =>
  z.number({ error: 'must be a number' }).min(min, `must be at least ${min} ${unit}`.trim()).max(max, `must be at most ${max} ${unit}`.trim());

export const MAX_BATCH_REPORTS = 500;

// PostgreSQL text cannot hold NUL; a router's odd SSID or firmware string is kept, the NUL shown as U+FFFD.
/* eslint-disable no-control-regex -- NUL is the one character PostgreSQL text refuses */
const storableText = (max: number) =>
  z
    .string()
    .max(max, `must be at most ${max} characters`)
    .transform((s) => s.replace(/\u0000/g, '\uFFFD'));
/* eslint-enable no-control-regex */

const macSchema = z
  .string({ error: 'must be a MAC address like 02:00:5e:10:00:01' })
  .regex(/^[0-9A-Fa-f]{2}(:[0-9A-Fa-f]{2}){5}$/, 'must be a MAC address like 02:00:5e:10:00:01');

export const heartbeatRadioSchema = z.object({
  iface: z.string({ error: 'is required' }).regex(/^[A-Za-z0-9._-]{1,15}$/, 'must be an interface name like wlan0'),
  role: z.enum(RADIO_ROLES, { error: `must be one of ${RADIO_ROLES.join(', ')}` }).optional(),
  band: z.enum(BANDS, { error: `must be one of ${BANDS.join(', ')}` }).optional(),
  channel: z.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be 1 or more').max(196, 'must be at most 196').optional(),
  channelWidthMHz: z
    .number({ error: 'must be a number' })
    .refine((w) => [...CHANNEL_WIDTHS_MHZ, 160].includes(w as 20), 'must be 20, 40, 80 or 160')
    .optional(),
  ssid: storableText(32).optional(),
  signalDbm: finite(-120, 0, 'dBm').optional(),
  noiseDbm: finite(-120, 0, 'dBm').optional(),
  txRateMbps: finite(0, 10_000, 'Mbps').optional(),
  rxRateMbps: finite(0, 10_000, 'Mbps').optional(),
  clients: z.number({ error: 'must be a number' }).int('must be a whole number').min(0, 'must be 0 or more').max(10_000, 'must be at most 10000').optional(),
  peerMac: macSchema.optional(),
  /** The radio's own MAC, so Parapet can tell which inventory radio a peer's report names. */
  mac: macSchema.optional(),
});

export const heartbeatReportSchema = z.object({
  seq: z
    .number({ error: 'must be a number' })
    .int('must be a whole number')
    .min(0, 'must be 0 or more')
    .max(2 ** 53 - 1, 'must be at most 2^53 - 1'),
  /** The kernel's boot id (/proc/sys/kernel/random/boot_id): with it, (bootId, seq) identifies a report. */
  bootId: z
    .string({ error: 'must be text' })
    .regex(/^[A-Za-z0-9._:-]{1,64}$/, 'must be 1 to 64 letters, digits, dots, colons or dashes, like the kernel boot id')
    .optional(),
  /** The node's own clock; a plainly wrong one is accepted and shown as clock trouble. */
  sentAt: z.iso.datetime({ offset: true, error: 'must be an ISO 8601 time like 2026-05-01T12:00:00Z' }),
  uptimeS: finite(0, 1e10, 's').optional(),
  load1: finite(0, 1000, '').optional(),
  memFreeKb: finite(0, 1e10, 'kB').optional(),
  firmware: storableText(120).optional(),
  throughputMbps: finite(0, 100_000, 'Mbps').optional(),
  latencyMs: finite(0, 600_000, 'ms').optional(),
  radios: z.array(heartbeatRadioSchema).max(8, 'must list at most 8 radios').optional(),
});

export const heartbeatBatchSchema = z.object({
  reports: z.array(heartbeatReportSchema).min(1, 'must hold at least one report').max(MAX_BATCH_REPORTS, `must hold at most ${MAX_BATCH_REPORTS} reports`),
});

export type HeartbeatReport = z.infer<typeof heartbeatReportSchema>;
export type HeartbeatRadio = z.infer<typeof heartbeatRadioSchema>;
