import type { Pagination as PaginationData } from '../../shared/schemas/common';
import { PAGE_SIZES } from '../lib/list-params';
import { Button } from './button';

interface PaginationProps {
  pagination: PaginationData;
  onPage: (page: number) => void;
  onPageSize: (pageSize: number) => void;
  noun: string;
}

export function Pagination({ pagination, onPage, onPageSize, noun }: PaginationProps) {
  const { page, pageSize, total } = pagination;
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label={`${noun} pages`} className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm text-muted">
      <p aria-live="polite">{total === 0 ? `No ${noun}` : `${first}–${last} of ${total} ${noun}`}</p>
      <div className="flex flex-wrap items-center gap-2">
        <label className="flex items-center gap-1.5">
          <span>Per page</span>
          <select
            className="rounded-md border border-line-strong bg-surface px-1.5 py-1 text-ink"
            value={pageSize}
            onChange={(event) => onPageSize(Number(event.target.value))}
          >
            {[...new Set([...PAGE_SIZES, pageSize])]
              .sort((a, b) => a - b)
              .map((size) => (
                <option key={size} value={size}>
                  {size}
                </option>
              ))}
          </select>
        </label>
        <Button disabled={page <= 1} onClick={() => onPage(page - 1)}>
          Previous
        </Button>
        <span className="tabular-nums">
          Page {Math.min(page, pageCount)} of {pageCount}
        </span>
        <Button disabled={page >= pageCount} onClick={() => onPage(page + 1)}>
          Next
        </Button>
      </div>
    </nav>
  );
}
