import { z } from 'zod';
import { NODE_STATES } from '../enums';
import { idSchema, lineSchema, listQuerySchema, nameSchema } from './common';

const ipv4 = /^(25[0-5]|2[0-4]\d|1\d\d|[1-9]?\d)(\.(25[0-5]|2[0-4]\d|1\d\d|[1-9]?\d)){3}$/;

const nodeFields = {
  name: nameSchema,
  siteId: idSchema,
  neighbourhoodId: idSchema.optional(),
  hardware: lineSchema(120).optional(),
  firmware: lineSchema(120).optional(),
  managementAddress: z.string().trim().regex(ipv4, 'must be an IPv4 address like 10.20.1.1').optional().nullable(),
  reportIntervalS: z
    .number({ error: 'must be a number' })
    .int('must be a whole number of seconds')
    .min(10, 'must be at least 10 s')
    .max(3600, 'must be at most 3600 s'),
  isUplink: z.boolean({ error: 'must be true or false' }).optional(),
};
export const nodeCreateSchema = z.object({ ...nodeFields, reportIntervalS: nodeFields.reportIntervalS.default(60) });
// Without defaults: zod fills defaults inside optional fields, which would reset what a partial update leaves out.
export const nodeUpdateSchema = z.object(nodeFields).partial();
export const nodeListQuerySchema = listQuerySchema.extend({
  state: z.enum(NODE_STATES, { error: `must be one of ${NODE_STATES.join(', ')}` }).optional(),
  neighbourhoodId: idSchema.optional(),
  siteId: idSchema.optional(),
});

export type NodeCreate = z.infer<typeof nodeCreateSchema>;

export interface NodeDto {
  id: number;
  name: string;
  siteId: number;
  neighbourhoodId: number;
  hardware: string | null;
  firmware: string | null;
  managementAddress: string | null;
  reportIntervalS: number;
  isUplink: boolean;
  state: (typeof NODE_STATES)[number];
  stateSince: string | null;
  lastSeenAt: string | null;
  /** Why the node is in its state, in a few words. */
  healthReason: string | null;
  /** The newest report's key figures and radios, as the node sent them. */
  lastReport: Record<string, unknown> | null;
  /** This node's own health thresholds, over the network's. */
  thresholds: Record<string, number> | null;
  /** Settings the node reports that differ from the inventory. */
  drift: { field: string; expected: unknown; reported: unknown }[];
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}
