import { col, fn, Op, where as sqlWhere, type Sequelize } from 'sequelize';
import type { z } from 'zod';
import {
  NODE_CSV_COLUMNS,
  NODE_CSV_REQUIRED,
  nodeCsvRowSchema,
  NUMERIC_CSV_COLUMNS,
  SITE_CSV_COLUMNS,
  SITE_CSV_REQUIRED,
  siteCsvRowSchema,
  type ImportKind,
  type ImportPreviewDto,
  type ImportRowPreview,
} from '../../shared/schemas/csvImport';
import { Invalid } from '../errors';
import { issuesToDetails } from '../middlewares/validate';
import { Neighbourhood, Node, Site } from '../models';
import { type Actor, mayManage } from '../policies/actor';
import { neighbourhoodScope } from '../policies/neighbourhood';
import { siteScope } from '../policies/site';
import { cellsToInput, readCsv } from './csvRead';

type Detail = { path: string; message: string };
const lower = (s: string) => s.toLocaleLowerCase('en');

interface Checked<T> {
  preview: ImportPreviewDto;
  records: T[];
}

/** Validates every row (shape, references, rights, duplicates) without writing anything. */
export async function checkImport(kind: ImportKind, bytes: Buffer, actor: Actor, maxRows: number): Promise<Checked<Record<string, unknown>>> {
  const spec = kind === 'sites' ? { columns: SITE_CSV_COLUMNS, required: SITE_CSV_REQUIRED } : { columns: NODE_CSV_COLUMNS, required: NODE_CSV_REQUIRED };
  const table = readCsv(bytes, spec.columns, spec.required, maxRows);
  const rows: ImportRowPreview[] = table.rows.map((values, i) => ({
    row: i + 1,
    values,
    errors: (table.problems.get(i + 1) ?? []).map((m) => ({ path: `rows.${i + 1}`, message: `rows.${i + 1} ${m.toLowerCase()}` })),
  }));
  const records = kind === 'sites' ? await checkSites(rows, actor) : await checkNodes(rows, actor);
  const errorCount = rows.filter((r) => r.errors.length).length;
  return { preview: { kind, columns: table.columns, rows, validCount: rows.length - errorCount, errorCount }, records };
}

function parseRow<S extends z.ZodType>(schema: S, r: ImportRowPreview): z.infer<S> | null {
  const result = schema.safeParse(cellsToInput(r.values, NUMERIC_CSV_COLUMNS));
  if (result.success) return result.data;
  r.errors.push(...issuesToDetails(result.error, ['rows', r.row]));
  return null;
}

const fail = (r: ImportRowPreview, field: string, message: string) =>
  r.errors.push({ path: `rows.${r.row}.${field}`, message: `rows.${r.row}.${field} ${message}` });

async function checkSites(rows: ImportRowPreview[], actor: Actor) {
  const hoods = await Neighbourhood.findAll({ where: { [Op.and]: [neighbourhoodScope(actor), { retiredAt: null }] } });
  const hoodByName = new Map(hoods.map((h) => [lower(h.name), h]));
  const parsed = rows.map((r) => ({ r, v: parseRow(siteCsvRowSchema, r) }));
  const existing = await Site.findAll({ attributes: ['name', 'neighbourhoodId'], where: { neighbourhoodId: hoods.map((h) => h.id) } });
  const taken = new Set(existing.map((s) => `${s.neighbourhoodId}:${lower(s.name)}`));
  const records: Record<string, unknown>[] = [];
  for (const { r, v } of parsed) {
    if (!v) continue;
    const hood = hoodByName.get(lower(v.neighbourhood));
    if (!hood) {
      fail(r, 'neighbourhood', `"${v.neighbourhood}" is not a neighbourhood you can see; check the spelling`);
      continue;
    }
    if (!mayManage(actor, hood.id)) {
      fail(r, 'neighbourhood', `"${hood.name}" is not a neighbourhood you operate, so you cannot add sites to it`);
      continue;
    }
    const key = `${hood.id}:${lower(v.name)}`;
    if (taken.has(key)) {
      fail(r, 'name', `"${v.name}" is already a site in ${hood.name} (or earlier in this file); choose another name`);
      continue;
    }
    taken.add(key);
    const { neighbourhood: _named, ...site } = v;
    records.push({ ...site, neighbourhoodId: hood.id });
  }
  return records;
}

async function checkNodes(rows: ImportRowPreview[], actor: Actor) {
  const sites = await Site.findAll({ attributes: ['id', 'name', 'neighbourhoodId'], where: siteScope(actor) });
  const sitesByName = new Map<string, Site[]>();
  for (const s of sites) sitesByName.set(lower(s.name), [...(sitesByName.get(lower(s.name)) ?? []), s]);
  const parsed = rows.map((r) => ({ r, v: parseRow(nodeCsvRowSchema, r) }));
  const names = parsed.flatMap(({ v }) => (v ? [lower(v.name)] : []));
  const clashes = names.length ? await Node.findAll({ attributes: ['name'], where: sqlWhere(fn('lower', col('name')), { [Op.in]: names }) }) : [];
  const taken = new Set(clashes.map((n) => lower(n.name)));
  const records: Record<string, unknown>[] = [];
  for (const { r, v } of parsed) {
    if (!v) continue;
    const matches = sitesByName.get(lower(v.site)) ?? [];
    if (matches.length === 0) {
      fail(r, 'site', `"${v.site}" is not a site you can see; check the spelling`);
      continue;
    }
    if (matches.length > 1) {
      fail(r, 'site', `"${v.site}" names ${matches.length} sites in different neighbourhoods; rename one so the name is unique`);
      continue;
    }
    const site = matches[0];
    if (!mayManage(actor, site.neighbourhoodId)) {
      fail(r, 'site', `"${site.name}" is in a neighbourhood you do not operate, so you cannot add nodes to it`);
      continue;
    }
    if (taken.has(lower(v.name))) {
      fail(r, 'name', `"${v.name}" is already a node name (or appears earlier in this file); node names are unique across the network`);
      continue;
    }
    taken.add(lower(v.name));
    const { site: _named, ...node } = v;
    records.push({ ...node, siteId: site.id, neighbourhoodId: site.neighbourhoodId });
  }
  return records;
}

/** All rows or none: one transaction, and nothing at all when any row has an error. */
export async function commitImport(sequelize: Sequelize, kind: ImportKind, checked: Checked<Record<string, unknown>>) {
  const bad = checked.preview.rows.filter((r) => r.errors.length);
  if (bad.length) {
    const details: Detail[] = bad.flatMap((r) => r.errors);
    throw Invalid(
      `Nothing was imported: ${bad.length} of ${checked.preview.rows.length} rows ${bad.length === 1 ? 'has an error' : 'have errors'}. First: ${details[0].message}. Fix the file and send it again.`,
      details,
    );
  }
  return sequelize.transaction(async (transaction) => {
    const model = kind === 'sites' ? Site : Node;
    const created = await (model as typeof Site).bulkCreate(checked.records as never[], { transaction, returning: true, validate: false });
    return created.map((c) => c.id);
  });
}
