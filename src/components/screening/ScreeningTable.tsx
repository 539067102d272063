/** The screening table: every permanent-grassland parcel with the level and CO2e of converting it, over the paged, sorted GET /api/screening. */
import { useEffect, useMemo, useRef, useState } from 'react';
import { createColumnHelper, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { Pager, ServerTable } from '../table/ServerTable';
import { LEVELS, RISK_LEVELS, type RiskLevel } from '~/lib/rules/levels';
import { RiskBadge } from '../ui/RiskBadge';
import { ApiError, apiFetch } from '../ui/api-client';
import { hectares, tonnes } from '../proposals/words';
import { screeningParams, type ScreeningQuery } from './query';

export type ScreeningRow = {
  parcelId: number;
  reference: string;
  areaHa: number;
  level: number | null;
  label: string | null;
  co2eTotal: number | null;
  co2eHigh: number | null;
  socLossPerHa: number | null;
  rules: string[];
  problem: string | null;
};
type Page = { items: ScreeningRow[]; total: number; page: number; pageSize: number };

const col = createColumnHelper<ScreeningRow>();
const Level = ({ r }: { r: ScreeningRow }) =>
  r.level ? (
    <RiskBadge level={r.level as RiskLevel} />
  ) : (
    <span className="text-muted">{r.problem ?? 'no figures'}</span>
  );
const perHa = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} t C/ha`);
const Rules = ({ r, titles }: { r: ScreeningRow; titles: Record<string, string> }) =>
  r.rules.length ? (
    <span className="text-xs">{r.rules.map((id) => titles[id] ?? id).join('; ')}</span>
  ) : (
    <span className="text-muted">none</span>
  );

const COLUMNS = [
  col.accessor('reference', {
    header: 'Parcel',
    cell: (c) => (
      <a className="whitespace-nowrap" href={`/map?parcel=${c.row.original.parcelId}`}>
        {c.getValue()}
      </a>
    ),
  }),
  col.accessor('areaHa', { id: 'area', header: 'Area', cell: (c) => hectares(c.getValue()), meta: { num: true } }),
  col.accessor('level', { id: 'level', header: 'Level if converted', cell: (c) => <Level r={c.row.original} /> }),
  col.accessor('co2eTotal', { id: 'co2e', header: 'CO2e', cell: (c) => tonnes(c.getValue(), 0), meta: { num: true } }),
  col.accessor('co2eHigh', {
    id: 'high',
    header: 'Upper bound',
    cell: (c) => tonnes(c.getValue(), 0),
    meta: { num: true },
  }),
  col.accessor('socLossPerHa', {
    id: 'loss',
    header: 'Soil carbon lost',
    cell: (c) => perHa(c.getValue()),
    meta: { num: true },
  }),
  col.display({
    id: 'rules',
    header: 'Rules that fire',
    cell: (c) => (
      <Rules r={c.row.original} titles={(c.table.options.meta as { titles: Record<string, string> }).titles} />
    ),
  }),
];
const UNSORTABLE = new Set(['rules']);

export function ScreeningTable({
  initial,
  initialQuery,
  regions,
  ruleTitles,
}: {
  initial: Page;
  initialQuery: ScreeningQuery;
  regions: { key: string; label: string }[];
  ruleTitles: Record<string, string>;
}) {
  const [query, setQuery] = useState<ScreeningQuery>(initialQuery);
  const [data, setData] = useState<Page>(initial);
  const [error, setError] = useState<string | null>(null);
  const [loading, setLoading] = useState(false);
  const first = useRef(true);

  useEffect(() => {
    if (first.current) return void (first.current = false);
    const params = screeningParams(query);
    window.history.replaceState(null, '', `${window.location.pathname}${params.size ? `?${params}` : ''}`);
    setLoading(true);
    apiFetch<Page>(`/api/screening?${params}`)
      .then(
        (d) => (setData(d), setError(null)),
        (e) => setError(e instanceof ApiError ? e.message : 'The table could not be loaded.'),
      )
      .finally(() => setLoading(false));
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
    getRowId: (r) => String(r.parcelId),
    manualSorting: true,
    manualPagination: true,
    pageCount,
    enableSortingRemoval: false,
    meta: { titles: ruleTitles },
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
  const set = (patch: Partial<ScreeningQuery>) => setQuery({ ...query, ...patch, page: 1 });
  const from = data.total === 0 ? 0 : (query.page - 1) * query.pageSize + 1;

  return (
    <div className="flex flex-col gap-3">
      <form
        className="panel grid gap-3 sm:grid-cols-3"
        role="search"
        aria-label="Filter the screening table"
        onSubmit={(e) => e.preventDefault()}
      >
        <div className="field">
          <label htmlFor="s-level" className="text-sm font-medium text-muted">
            Level if converted
          </label>
          <select id="s-level" className="input" value={query.level} onChange={(e) => set({ level: e.target.value })}>
            <option value="">Any level</option>
            {RISK_LEVELS.map((l) => (
              <option key={l} value={l}>
                {l} · {LEVELS[l].label}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="s-region" className="text-sm font-medium text-muted">
            Accounting region
          </label>
          <select
            id="s-region"
            className="input"
            value={query.region}
            onChange={(e) => set({ region: e.target.value })}
          >
            <option value="">All regions</option>
            {regions.map((r) => (
              <option key={r.key} value={r.key}>
                {r.label}
              </option>
            ))}
          </select>
        </div>
        <div className="field">
          <label htmlFor="s-sort" className="text-sm font-medium text-muted">
            Sort by
          </label>
          <select
            id="s-sort"
            className="input"
            value={`${query.sort}:${query.dir}`}
            onChange={(e) => {
              const [sort, dir] = e.target.value.split(':');
              set({ sort: sort!, dir: dir as 'asc' | 'desc' });
            }}
          >
            {[
              ['level', 'desc', 'Highest level'],
              ['co2e', 'desc', 'Largest CO2e'],
              ['high', 'desc', 'Largest upper bound'],
              ['loss', 'desc', 'Most soil carbon lost per ha'],
              ['area', 'desc', 'Largest area'],
              ['reference', 'asc', 'Parcel reference'],
            ].map(([s, d, l]) => (
              <option key={s} value={`${s}:${d}`}>
                {l}
              </option>
            ))}
          </select>
        </div>
      </form>

      <p aria-live="polite" className="text-sm">
        {loading
          ? 'Loading…'
          : data.total === 0
            ? 'No parcels match.'
            : `Parcels ${from}–${from + data.items.length - 1} of ${data.total}`}
      </p>
      {error && (
        <p className="notice notice-warn" role="alert">
          ⚠ {error}
        </p>
      )}

      <ServerTable table={table} sortable={(id) => !UNSORTABLE.has(id)} numClass="num whitespace-nowrap" />

      <ul className="flex flex-col gap-2 md:hidden" aria-label="Screened parcels">
        {table.getRowModel().rows.map(({ original: r }) => (
          <li key={r.parcelId} className="panel flex flex-col gap-1 text-sm">
            <a href={`/map?parcel=${r.parcelId}`} className="font-semibold">
              {r.reference}
            </a>
            <p className="flex flex-wrap items-center gap-2">
              <Level r={r} /> {hectares(r.areaHa)}
            </p>
            <p>
              {tonnes(r.co2eTotal, 0)} (up to {tonnes(r.co2eHigh, 0)}) · soil carbon lost {perHa(r.socLossPerHa)}
            </p>
            {r.rules.length > 0 && (
              <p>
                Rules that fire: <Rules r={r} titles={ruleTitles} />
              </p>
            )}
          </li>
        ))}
      </ul>

      <Pager
        table={table}
        page={query.page}
        pageCount={pageCount}
        pageSize={query.pageSize}
        sizes={[25, 50, 100]}
        id="s-page-size"
      />
    </div>
  );
}
