import { z } from 'zod';
import { LINK_STATUSES } from '../enums';
import { idSchema, listQuerySchema, nameSchema } from './common';

export const linkCreateSchema = z
  .object({
    name: nameSchema.optional(),
    radioAId: idSchema,
    radioBId: idSchema,
    status: z.enum(LINK_STATUSES, { error: `must be one of ${LINK_STATUSES.join(', ')}` }).default('planned'),
  })
  .refine((l) => l.radioAId !== l.radioBId, { message: 'must be a different radio from radioAId: a link joins two radios', path: ['radioBId'] });
export const linkUpdateSchema = z.object({
  name: nameSchema.optional(),
  status: z.enum(LINK_STATUSES, { error: `must be one of ${LINK_STATUSES.join(', ')}` }).optional(),
});
export const linkListQuerySchema = listQuerySchema.extend({
  status: z.enum(LINK_STATUSES, { error: `must be one of ${LINK_STATUSES.join(', ')}` }).optional(),
  nodeId: idSchema.optional(),
});

export type LinkCreate = z.infer<typeof linkCreateSchema>;

export interface LinkDto {
  id: number;
  name: string | null;
  radioAId: number;
  radioBId: number;
  nodeAId: number;
  nodeBId: number;
  status: (typeof LINK_STATUSES)[number];
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}
