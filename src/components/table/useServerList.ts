/**
 * State of a list paged, sorted and filtered on the server: the query (mirrored into the address
 * bar), the page last fetched, loading and error, and a tanstack table in manual mode over it.
 * Used by the proposals list and the screening table with ServerTable and Pager.
 */
import { useEffect, useMemo, useRef, useState } from 'react';
import { getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from '@tanstack/react-table';
import { ApiError, apiFetch } from '../ui/api-client';

export type ServerQuery = { page: number; pageSize: number; sort: string; dir: 'asc' | 'desc' };
export type ServerPage<T> = { items: T[]; total: number; page: number; pageSize: number };

export function useServerList<T, Q extends ServerQuery>({
  endpoint,
  initial,
  initialQuery,
  toParams,
  columns,
  rowId,
  meta,
  debounceMs = 0,
  failure,
}: {
  endpoint: string;
  initial: ServerPage<T>;
  initialQuery: Q;
  toParams: (q: Q) => URLSearchParams;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any -- tanstack's column helper yields mixed value types
  columns: ColumnDef<T, any>[];
  rowId: (row: T) => string;
  meta?: Record<string, unknown>;
  /** Waits this long after the last change before fetching (typing into a search box). */
  debounceMs?: number;
  /** What to say when the page cannot be fetched and the server gave no message. */
  failure: string;
}) {
  const [query, setQuery] = useState<Q>(initialQuery);
  const [data, setData] = useState<ServerPage<T>>(initial);
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(false);
  const first = useRef(true);

  useEffect(() => {
    if (first.current) return void (first.current = false);
    const params = toParams(query);
    window.history.replaceState(null, '', `${window.location.pathname}${params.size ? `?${params}` : ''}`);
    const fetchPage = () => {
      setLoading(true);
      apiFetch<ServerPage<T>>(`${endpoint}?${params}`)
        .then(
          (d) => (setData(d), setError(null)),
          (e) => setError(e instanceof ApiError ? e.message : failure),
        )
        .finally(() => setLoading(false));
    };
    if (!debounceMs) return fetchPage();
    const t = setTimeout(fetchPage, debounceMs);
    return () => clearTimeout(t);
  }, [query]);

  const sorting: SortingState = useMemo(
    () => [{ id: query.sort, desc: query.dir === 'desc' }],
    [query.sort, query.dir],
  );
  const pageCount = Math.max(1, Math.ceil(data.total / query.pageSize));
  const table = useReactTable({
    data: data.items,
    columns,
    getCoreRowModel: getCoreRowModel(),
    getRowId: rowId,
    manualSorting: true,
    manualPagination: true,
    pageCount,
    enableSortingRemoval: false,
    meta,
    state: { sorting, pagination: { pageIndex: query.page - 1, pageSize: query.pageSize } },
    onSortingChange: (u) => {
      const next = (typeof u === 'function' ? u(sorting) : u)[0];
      if (next) setQuery({ ...query, sort: next.id, dir: next.desc ? 'desc' : 'asc', page: 1 });
    },
    onPaginationChange: (u) => {
      const next = typeof u === 'function' ? u({ pageIndex: query.page - 1, pageSize: query.pageSize }) : u;
      setQuery({ ...query, page: next.pageIndex + 1, pageSize: next.pageSize });
    },
  });
  /** A filter or sort change: back to the first page. */
  const set = (patch: Partial<Q>) => setQuery({ ...query, ...patch, page: 1 });
  const from = data.total === 0 ? 0 : (query.page - 1) * query.pageSize + 1;
  return { query, set, data, error, loading, table, pageCount, from };
}
