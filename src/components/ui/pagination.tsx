import { Button } from './button';

interface PaginationProps {
  page: number;
  pageSize: number;
  total: number;
  /** What is being counted, plural: "accounts". */
  noun: string;
  onPageChange: (page: number) => void;
  onPageSizeChange?: (pageSize: number) => void;
  pageSizes?: number[];
}

const numberFormat = new Intl.NumberFormat('en-US');

export function Pagination({ page, pageSize, total, noun, onPageChange, onPageSizeChange, pageSizes = [25, 50, 100] }: PaginationProps) {
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);

  return (
    <nav aria-label="Pagination" className="flex flex-wrap items-center justify-between gap-3 py-3">
      <p className="text-loam-800 tabular" aria-live="polite">
        {total === 0
          ? `No ${noun}`
          : `${numberFormat.format(first)}–${numberFormat.format(last)} of ${numberFormat.format(total)} ${noun}`}
      </p>
      <div className="flex flex-wrap items-center gap-2">
        {onPageSizeChange && (
          <label className="flex items-center gap-2 text-loam-800">
            Rows per page
            <select
              className="min-h-11 rounded-lg border border-loam-500 bg-white px-2"
              value={pageSize}
              onChange={(event) => onPageSizeChange(Number(event.target.value))}
            >
              {pageSizes.map((size) => (
                <option key={size} value={size}>
                  {size}
                </option>
              ))}
            </select>
          </label>
        )}
        <Button variant="secondary" onClick={() => onPageChange(page - 1)} disabled={page <= 1}>
          <span aria-hidden="true">‹</span> Previous
        </Button>
        <span className="px-1 text-loam-800 tabular">
          Page {page} of {pageCount}
        </span>
        <Button variant="secondary" onClick={() => onPageChange(page + 1)} disabled={page >= pageCount}>
          Next <span aria-hidden="true">›</span>
        </Button>
      </div>
    </nav>
  );
}
