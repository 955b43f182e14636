import { z } from 'zod';
import type { NodeState } from '../enums';
import { idSchema, listQuerySchema, nameSchema, notesSchema } from './common';

export const neighbourhoodCreateSchema = z.object({
  name: nameSchema,
  description: notesSchema.optional(),
});
export const neighbourhoodUpdateSchema = neighbourhoodCreateSchema.partial().extend({
  /** Retiring keeps the neighbourhood for history and hides it from pickers; false brings it back. */
  retired: z.boolean({ error: 'must be true or false' }).optional(),
});
export const neighbourhoodListQuerySchema = listQuerySchema.extend({
  // Pickers ask for the default (active only); the neighbourhoods page asks for all.
  retired: z.enum(['false', 'true', 'all'], { error: 'must be one of false, true, all' }).default('false'),
});
export const neighbourhoodNodesSchema = z.object({
  nodeIds: z.array(idSchema, { error: 'must be a list of node ids' }).min(1, 'must name at least one node').max(500, 'at most 500 nodes at once'),
});

export const operatorAssignmentSchema = z.object({
  userIds: z.array(idSchema).max(500, 'at most 500 people at once'),
});

export type NeighbourhoodCreate = z.infer<typeof neighbourhoodCreateSchema>;

export interface NeighbourhoodDto {
  id: number;
  name: string;
  description: string | null;
  operatorIds: number[];
  siteCount: number;
  nodeCount: number;
  retiredAt: string | null;
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}

export interface NeighbourhoodSummaryDto {
  availability: { h24Pct: number | null; d30Pct: number | null };
  nodes: { id: number; name: string; state: NodeState; siteId: number; siteName: string; availability: { h24Pct: number | null; d30Pct: number | null } }[];
  operators: { id: number; name: string }[];
  hosts: { siteId: number; siteName: string; host: { id: number; name: string } | null }[];
}
