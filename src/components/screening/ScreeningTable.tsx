/** The screening table: every permanent-grassland parcel with the level and CO2e of converting it, over the paged, sorted GET /api/screening. */
import { createColumnHelper } from '@tanstack/react-table';
import { Pager, ServerTable } from '../table/ServerTable';
import { type RiskLevel } from '~/lib/rules/levels';
import { LevelFilter, ListCount, ListError, SortChoice } from '../table/ListControls';
import { RiskBadge } from '../ui/RiskBadge';
import { useServerList, type ServerPage } from '../table/useServerList';
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
type Page = ServerPage<ScreeningRow>;

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
  const { query, set, data, error, loading, table, pageCount, from } = useServerList<ScreeningRow, ScreeningQuery>({
    endpoint: '/api/screening',
    initial,
    initialQuery,
    toParams: screeningParams,
    columns: COLUMNS,
    rowId: (r) => String(r.parcelId),
    meta: { titles: ruleTitles },
    failure: 'The table could not be loaded.',
  });

  return (
    <div className="flex flex-col gap-3">
      <form
        className="panel grid gap-3 sm:grid-cols-3"
        role="search"
        aria-label="Filter the screening table"
        onSubmit={(e) => e.preventDefault()}
      >
        <LevelFilter id="s-level" label="Level if converted" value={query.level} onChange={(level) => set({ level })} />
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
          <SortChoice
            id="s-sort"
            sort={query.sort}
            dir={query.dir}
            choices={[
              ['level', 'desc', 'Highest level'],
              ['co2e', 'desc', 'Largest CO2e'],
              ['high', 'desc', 'Largest upper bound'],
              ['loss', 'desc', 'Most soil carbon lost per ha'],
              ['area', 'desc', 'Largest area'],
              ['reference', 'asc', 'Parcel reference'],
            ]}
            onChange={(sort, dir) => set({ sort, dir })}
          />
        </div>
      </form>

      <ListCount loading={loading} total={data.total} from={from} shown={data.items.length} things="Parcels" />
      <ListError error={error} />

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
