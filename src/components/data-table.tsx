import type { ReactNode } from 'react';

export interface Column<Row> {
  key: string;
  header: string;
  /** The server's field name for `sort=`; absent means the column cannot be sorted. */
  sortKey?: string;
  render: (row: Row) => ReactNode;
  align?: 'left' | 'right';
}

interface DataTableProps<Row> {
  rows: Row[];
  columns: Column<Row>[];
  rowKey: (row: Row) => string | number;
  caption: string;
  sort?: string;
  onSort?: (sort: string) => void;
  testId?: string;
}

/** On a phone each row becomes a card and each cell a label-and-value line. */
const CELL_STACKED = 'max-sm:flex max-sm:items-baseline max-sm:justify-between max-sm:gap-3 max-sm:px-0 max-sm:py-1 max-sm:text-right';

function sortState(sort: string | undefined, key: string): 'ascending' | 'descending' | 'none' {
  if (sort === key) return 'ascending';
  if (sort === `-${key}`) return 'descending';
  return 'none';
}

function SortArrow({ state }: { state: 'ascending' | 'descending' | 'none' }) {
  const d = state === 'ascending' ? 'M4 10l4-4 4 4' : state === 'descending' ? 'M4 6l4 4 4-4' : 'M5 6.5l3-3 3 3M5 9.5l3 3 3-3';
  return (
    <svg width="12" height="12" viewBox="0 0 16 16" aria-hidden="true" className={state === 'none' ? 'opacity-40' : ''}>
      <path d={d} fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

/**
 * A table on wide screens; on phones each row becomes a card whose cells carry their
 * column's name, so nothing scrolls sideways.
 */
export function DataTable<Row>({ rows, columns, rowKey, caption, sort, onSort, testId }: DataTableProps<Row>) {
  return (
    <div className="rounded-lg border border-line bg-surface max-sm:border-0 max-sm:bg-transparent">
      <table data-testid={testId} className="w-full border-collapse text-sm max-sm:block">
        <caption className="sr-only">{caption}</caption>
        <thead className="max-sm:sr-only">
          <tr className="border-b border-line text-left text-muted">
            {columns.map((column) => {
              const state = sortState(sort, column.sortKey ?? '');
              return (
                <th
                  key={column.key}
                  scope="col"
                  aria-sort={column.sortKey ? state : undefined}
                  className={`px-3 py-2 font-medium whitespace-nowrap ${column.align === 'right' ? 'text-right' : ''}`}
                >
                  {column.sortKey && onSort ? (
                    <button
                      type="button"
                      className="inline-flex items-center gap-1 rounded hover:text-ink"
                      onClick={() => onSort(state === 'ascending' ? `-${column.sortKey}` : column.sortKey!)}
                    >
                      {column.header}
                      <SortArrow state={state} />
                    </button>
                  ) : (
                    column.header
                  )}
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody className="max-sm:block max-sm:space-y-3">
          {rows.map((row) => (
            <tr
              key={rowKey(row)}
              className={
                'border-b border-line last:border-0 ' +
                'max-sm:block max-sm:rounded-lg max-sm:border max-sm:bg-surface max-sm:px-3 max-sm:py-2 max-sm:last:border'
              }
            >
              {columns.map((column, index) => (
                <td
                  key={column.key}
                  data-label={column.header}
                  className={`px-3 py-2 align-middle ${CELL_STACKED} ${
                    index === 0 ? 'max-sm:text-base max-sm:font-medium' : 'max-sm:before:text-muted max-sm:before:content-[attr(data-label)]'
                  } ${column.align === 'right' ? 'text-right tabular-nums' : ''}`}
                >
                  {column.render(row)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
