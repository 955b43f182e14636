import { z } from 'zod';
import { idSchema, listQuerySchema, nameSchema } from './common';

export const neighbourhoodCreateSchema = z.object({
  name: nameSchema,
  description: z.string().trim().max(2000, 'must be at most 2000 characters').optional(),
});
export const neighbourhoodUpdateSchema = neighbourhoodCreateSchema.partial();
export const neighbourhoodListQuerySchema = listQuerySchema;

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
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}
