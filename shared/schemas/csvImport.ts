import { z } from 'zod';
import { nameSchema } from './common';
import { nodeCreateSchema } from './node';
import { siteCreateSchema } from './site';

// Parapet's CSV layouts: one header row with these column names (any order); a neighbourhood or
// site is named, not numbered, so a file written by hand or exported from a spreadsheet works.
export const SITE_CSV_COLUMNS = ['name', 'neighbourhood', 'latitude', 'longitude', 'groundElevationM', 'antennaHeightM', 'accessNotes'] as const;
export const NODE_CSV_COLUMNS = ['name', 'site', 'hardware', 'firmware', 'managementAddress', 'reportIntervalS'] as const;
export const SITE_CSV_REQUIRED = ['name', 'neighbourhood', 'latitude', 'longitude'] as const;
export const NODE_CSV_REQUIRED = ['name', 'site'] as const;
export const NUMERIC_CSV_COLUMNS = new Set(['latitude', 'longitude', 'groundElevationM', 'antennaHeightM', 'reportIntervalS']);

/** A site row: the site form's own schema, with the neighbourhood named instead of numbered. */
export const siteCsvRowSchema = siteCreateSchema.omit({ neighbourhoodId: true, hostUserId: true }).extend({ neighbourhood: nameSchema });
/** A node row: the node form's own schema, with the site named; the node joins the site's neighbourhood. */
export const nodeCsvRowSchema = nodeCreateSchema.omit({ siteId: true, neighbourhoodId: true, isUplink: true }).extend({ site: nameSchema });

export const IMPORT_KINDS = ['sites', 'nodes'] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];

export const importQuerySchema = z.object({
  dryRun: z
    .enum(['true', 'false'], { error: 'must be true or false' })
    .default('false')
    .transform((v) => v === 'true'),
});

export interface ImportRowPreview {
  /** 1 = the first row under the header (line 2 of the file). */
  row: number;
  values: Record<string, string>;
  errors: { path: string; message: string }[];
}

export interface ImportPreviewDto {
  kind: ImportKind;
  columns: readonly string[];
  rows: ImportRowPreview[];
  validCount: number;
  errorCount: number;
}

export interface ImportResultDto {
  kind: ImportKind;
  created: number;
  ids: number[];
}
