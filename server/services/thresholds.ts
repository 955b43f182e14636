import { QueryTypes, type Sequelize } from 'sequelize';
import { DEFAULT_THRESHOLDS, type HealthThresholds } from '../../shared/health/state';
import { cacheGeneration, cachesForgot, ingestCacheMs } from './ingestCacheMs';

let cached: { at: number; value: Partial<HealthThresholds> } | null = null;

/** Network thresholds (admin setting) over the defaults; a node's own overrides on top. */
export async function thresholdsFor(sequelize: Sequelize, nodeOverrides: Partial<HealthThresholds> | null): Promise<HealthThresholds> {
  if (!cached || Date.now() - cached.at >= ingestCacheMs()) {
    const generation = cacheGeneration();
    const rows = await sequelize.query<{ thresholds: Partial<HealthThresholds> }>('SELECT thresholds FROM network_settings WHERE id = 1', {
      type: QueryTypes.SELECT,
    });
    const value = rows[0]?.thresholds ?? {};
    if (generation === cacheGeneration()) cached = { at: Date.now(), value };
    return { ...DEFAULT_THRESHOLDS, ...value, ...(nodeOverrides ?? {}) };
  }
  return { ...DEFAULT_THRESHOLDS, ...cached.value, ...(nodeOverrides ?? {}) };
}

export function forgetThresholds() {
  cached = null;
  cachesForgot();
}
