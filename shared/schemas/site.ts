import { z } from 'zod';
import { idSchema, listQuerySchema, nameSchema, notesSchema } from './common';

const siteFields = {
  name: nameSchema,
  neighbourhoodId: idSchema,
  latitude: z.number({ error: 'must be a number' }).min(-90, 'must be between -90 and 90').max(90, 'must be between -90 and 90'),
  longitude: z.number({ error: 'must be a number' }).min(-180, 'must be between -180 and 180').max(180, 'must be between -180 and 180'),
  groundElevationM: z.number({ error: 'must be a number' }).min(-450, 'must be at least -450 m').max(9000, 'must be at most 9000 m'),
  antennaHeightM: z.number({ error: 'must be a number' }).min(0, 'must be 0 m or more').max(300, 'must be at most 300 m'),
  accessNotes: notesSchema.optional(),
  hostUserId: idSchema.nullable().optional(),
};
export const siteCreateSchema = z.object({
  ...siteFields,
  groundElevationM: siteFields.groundElevationM.default(0),
  antennaHeightM: siteFields.antennaHeightM.default(0),
});
// Built from the fields without defaults: zod fills defaults inside optional fields, which would
// quietly reset every field a partial update leaves out.
export const siteUpdateSchema = z.object(siteFields).partial();
export const siteListQuerySchema = listQuerySchema.extend({
  neighbourhoodId: idSchema.optional(),
  hostUserId: idSchema.optional(),
});

export type SiteCreate = z.infer<typeof siteCreateSchema>;

export interface SiteDto {
  id: number;
  name: string;
  neighbourhoodId: number;
  latitude: number;
  longitude: number;
  groundElevationM: number;
  antennaHeightM: number;
  accessNotes: string | null;
  hostUserId: number | null;
  /** Host's name and contact: only for roles that may see them. */
  host?: { id: number; name: string; email?: string; phone?: string | null } | null;
  createdAt: string;
  updatedAt: string;
  abilities: { update: boolean; delete: boolean };
}
