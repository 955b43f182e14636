import { z } from 'zod';

// Settings of the public page, uploads and CSV imports, read from the environment like config.ts.
const envSchema = z.object({
  PUBLIC_STATUS_CACHE_S: z.coerce.number().int().min(0).max(3600).default(30),
  DATA_DIR: z.string().min(1).default('.data/uploads'),
  PHOTO_MAX_BYTES: z.coerce.number().int().min(1024).default(8 * 1024 * 1024),
  CSV_IMPORT_MAX_BYTES: z.coerce.number().int().min(1024).default(2 * 1024 * 1024),
  CSV_IMPORT_MAX_ROWS: z.coerce.number().int().min(1).default(5000),
});

export interface FeatureSettings {
  /** Seconds one computation of the public status page is served to everyone. */
  publicStatusCacheS: number;
  /** Where uploaded files live (photos under `photos/`). */
  dataDir: string;
  photoMaxBytes: number;
  csvImportMaxBytes: number;
  csvImportMaxRows: number;
}

export function loadFeatureSettings(env: Record<string, string | undefined> = process.env): FeatureSettings {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Parapet's settings are invalid:\n${lines}`);
  }
  const e = parsed.data;
  return {
    publicStatusCacheS: e.PUBLIC_STATUS_CACHE_S,
    dataDir: e.DATA_DIR,
    photoMaxBytes: e.PHOTO_MAX_BYTES,
    csvImportMaxBytes: e.CSV_IMPORT_MAX_BYTES,
    csvImportMaxRows: e.CSV_IMPORT_MAX_ROWS,
  };
}
