/** The proposals list: a headless table (@tanstack/react-table) over the paged, sorted, filtered GET /api/proposals. */
import { formatDate } from '~/lib/format/dates';
import { useEffect, useMemo, useRef, useState } from 'react';
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { Pager, ServerTable } from '../table/ServerTable';
import { PROPOSAL_STATES } from '~/lib/proposals/states';
import { LEVELS, RISK_LEVELS, type RiskLevel } from '~/lib/rules/levels';
import { RiskBadge } from '../ui/RiskBadge';
import { ApiError, apiFetch } from '../ui/api-client';
import { toParams, type ListQuery } from './list-query';
import { clockWords, hectares, stateLabel, tonnes } from './words';

export type ProposalRow = {
  id: number;
  reference: string;
  title: string;
  state: string;
  parcelCount: number;
  parcelReferences: string[];
  areaHa: number;
  decisionDue: string | null;
  daysLeft: number | null;
  riskLevel: number | null;
  riskLabel: string | null;
  co2eTotal: number | null;
  updatedAt: string;
};
type Page = { items: ProposalRow[]; total: number; page: number; pageSize: number };

const col = createColumnHelper<ProposalRow>();
const parcelsText = (r: ProposalRow) =>
  `${r.parcelReferences.slice(0, 3).join(', ')}${r.parcelCount > 3 ? ` and ${r.parcelCount - 3} more` : ''}`;
const Clock = ({ r }: { r: ProposalRow }) => {
  const c = clockWords(r.decisionDue, r.daysLeft);
  return c.overdue ? (
    <strong className="text-clay-700">⚠ {c.text}</strong>
  ) : (
    <span>{r.decisionDue ? c.text : '—'}</span>
  );
};
const Risk = ({ r }: { r: ProposalRow }) =>
  r.riskLevel ? <RiskBadge level={r.riskLevel as RiskLevel} /> : <span className="text-muted">not assessed</span>;

const COLUMNS = [
  col.accessor('reference', {
    header: 'Reference',
    cell: (c) => <a href={`/proposals/${c.row.original.id}`}>{c.getValue()}</a>,
  }),
  col.accessor('title', { header: 'Title' }),
  col.accessor('state', { header: 'State', cell: (c) => stateLabel(c.getValue()) }),
  col.display({ id: 'parcels', header: 'Parcels', cell: (c) => parcelsText(c.row.original) }),
  col.accessor('areaHa', { id: 'area', header: 'Area', cell: (c) => hectares(c.getValue()), meta: { num: true } }),
  col.accessor('riskLevel', { id: 'risk', header: 'Risk', cell: (c) => <Risk r={c.row.original} /> }),
  col.accessor('co2eTotal', { id: 'co2e', header: 'CO2e', cell: (c) => tonnes(c.getValue(), 0), meta: { num: true } }),
  col.accessor('daysLeft', { id: 'deadline', header: 'Decision due', cell: (c) => <Clock r={c.row.original} /> }),
  col.accessor('updatedAt', { id: 'updated', header: 'Updated', cell: (c) => formatDate(c.getValue()) }),
];

export function ProposalList({
  initial,
  initialQuery,
  canFile,
}: {
  initial: Page;
  initialQuery: ListQuery;
  canFile: boolean;
}) {
  const [query, setQuery] = useState<ListQuery>(initialQuery);
  const [data, setData] = useState<Page>(initial);
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(false);
  const first = useRef(true);

  useEffect(() => {
    if (first.current) return void (first.current = false);
    const params = toParams(query);
    window.history.replaceState(null, '', `${window.location.pathname}${params.size ? `?${params}` : ''}`);
    const t = setTimeout(() => {
      setLoading(true);
      apiFetch<Page>(`/api/proposals?${params}`)
        .then(
          (d) => (setData(d), setError(null)),
          (e) => setError(e instanceof ApiError ? e.message : 'The list could not be loaded.'),
        )
        .finally(() => setLoading(false));
    }, 200);
    return () => clearTimeout(t);
  }, [query]);

  const sorting: SortingState = useMemo(
    () => [{ id: query.sort, desc: query.dir === 'desc' }],
    [query.sort, query.dir],
  );
  const pageCount = Math.max(1, Math.ceil(data.total / query.pageSize));
  const table = useReactTable({
    data: data.items,
    columns: COLUMNS,
    getCoreRowModel: getCoreRowModel(),
    getRowId: (r) => String(r.id),
    manualSorting: true,
    manualPagination: true,
    pageCount,
    enableSortingRemoval: false,
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
  const set = (patch: Partial<ListQuery>) => setQuery({ ...query, ...patch, page: 1 });
  const from = data.total === 0 ? 0 : (query.page - 1) * query.pageSize + 1;

  return (
    <div className="flex flex-col gap-3">
      <form
        className="panel grid gap-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto]"
        role="search"
        aria-label="Filter proposals"
        onSubmit={(e) => e.preventDefault()}
      >
        <div className="field">
          <label htmlFor="f-q" className="text-sm font-medium text-muted">
            Words in reference or title
          </label>
          <input
            id="f-q"
            className="input"
            type="search"
            value={query.q}
            onChange={(e) => set({ q: e.target.value })}
          />
        </div>
        <div className="field">
          <label htmlFor="f-state" className="text-sm font-medium text-muted">
            State
          </label>
          <select id="f-state" className="input" value={query.state} onChange={(e) => set({ state: e.target.value })}>
            <option value="">Any state</option>
            {PROPOSAL_STATES.map((s) => (
              <option key={s} value={s}>
                {stateLabel(s)}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="f-parcel" className="text-sm font-medium text-muted">
            Parcel reference
          </label>
          <input
            id="f-parcel"
            className="input"
            value={query.parcel}
            onChange={(e) => set({ parcel: e.target.value })}
          />
        </div>
        <div className="field">
          <label htmlFor="f-risk" className="text-sm font-medium text-muted">
            Risk level
          </label>
          <select id="f-risk" className="input" value={query.risk} onChange={(e) => set({ risk: e.target.value })}>
            <option value="">Any level</option>
            {RISK_LEVELS.map((l) => (
              <option key={l} value={l}>
                {l} · {LEVELS[l].label}
              </option>
            ))}
          </select>
        </div>
        {canFile && (
          <a className="btn self-end justify-center" href="/proposals/new">
            File a proposal
          </a>
        )}
      </form>

      <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
        <p aria-live="polite">
          {loading
            ? 'Loading…'
            : data.total === 0
              ? 'No proposals match.'
              : `Proposals ${from}–${from + data.items.length - 1} of ${data.total}`}
        </p>
        <div className="flex items-center gap-2 md:hidden">
          <label htmlFor="m-sort" className="text-muted">
            Sort by
          </label>
          <select
            id="m-sort"
            className="input"
            value={`${query.sort}:${query.dir}`}
            onChange={(e) => {
              const [sort, dir] = e.target.value.split(':');
              set({ sort, dir: dir as 'asc' | 'desc' });
            }}
          >
            {[
              ['updated', 'desc', 'Recently updated'],
              ['deadline', 'asc', 'Decision due soonest'],
              ['risk', 'desc', 'Highest risk'],
              ['co2e', 'desc', 'Largest CO2e'],
              ['reference', 'asc', 'Reference'],
            ].map(([s, d, l]) => (
              <option key={s} value={`${s}:${d}`}>
                {l}
              </option>
            ))}
          </select>
        </div>
      </div>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}

      <ServerTable table={table} sortable={(id) => id !== 'parcels' && table.getColumn(id)?.getCanSort() === true} />

      <ul className="flex flex-col gap-2 md:hidden" aria-label="Proposals">
        {table.getRowModel().rows.map(({ original: r }) => (
          <li key={r.id} className="panel flex flex-col gap-1 text-sm">
            <a href={`/proposals/${r.id}`} className="font-semibold">
              {r.reference} · {r.title}
            </a>
            <p>
              {stateLabel(r.state)} · {hectares(r.areaHa)} · {r.parcelCount} parcel{r.parcelCount === 1 ? '' : 's'}:{' '}
              {parcelsText(r)}
            </p>
            <p className="flex flex-wrap items-center gap-2">
              Risk: <Risk r={r} />
              {r.co2eTotal !== null && <span>· {tonnes(r.co2eTotal, 0)}</span>}
            </p>
            <p>
              Decision: <Clock r={r} />
            </p>
            <p className="text-xs text-muted">Updated {formatDate(r.updatedAt)}</p>
          </li>
        ))}
      </ul>

      <Pager
        table={table}
        page={query.page}
        pageCount={pageCount}
        pageSize={query.pageSize}
        sizes={[10, 25, 50, 100]}
        id="page-size"
      />
    </div>
  );
}
