import { Op, type Model, type ModelStatic, type FindOptions, type WhereOptions } from 'sequelize';
import type { ListQuery } from '../../shared/schemas/common';
import { Invalid } from '../errors';

export interface ListSpec {
  where: WhereOptions;
  /** API field name → model attribute that may be sorted on. */
  sortable: readonly string[];
  /** Attributes searched with `q` (case-insensitive substring). */
  searchable: readonly string[];
  defaultSort: string;
  include?: FindOptions['include'];
}

/** One page of records, sorted and searched on the server, with the total for the envelope. */
export async function listPage<M extends Model>(model: ModelStatic<M>, query: ListQuery, spec: ListSpec) {
  const sort = query.sort ?? spec.defaultSort;
  const field = sort.replace(/^-/, '');
  if (!spec.sortable.includes(field)) {
    throw Invalid(`Cannot sort by "${field}". Sort by one of: ${spec.sortable.join(', ')}.`, [
      { path: 'sort', message: `sort must be one of ${spec.sortable.join(', ')} (prefix with - for descending)` },
    ]);
  }
  const where: WhereOptions[] = [spec.where];
  if (query.q && spec.searchable.length) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push({ [Op.or]: spec.searchable.map((a) => ({ [a]: { [Op.iLike]: like } })) });
  }
  const { rows, count } = await model.findAndCountAll({
    where: { [Op.and]: where },
    include: spec.include,
    order: [
      [field, sort.startsWith('-') ? 'DESC' : 'ASC'],
      ['id', 'ASC'],
    ],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
    subQuery: false, // every include is to-one, and scopes filter on included columns
  });
  return { rows, pagination: { page: query.page, pageSize: query.pageSize, total: count } };
}

/** Keeps only the filters that were given, so `undefined` never reaches a where-clause. */
export function filters(values: Record<string, unknown>): WhereOptions {
  return Object.fromEntries(Object.entries(values).filter(([, v]) => v !== undefined));
}
