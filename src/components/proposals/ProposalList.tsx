/** The proposals list: a headless table (@tanstack/react-table) over the paged, sorted, filtered GET /api/proposals. */
import { formatDate } from '~/lib/format/dates';
import { createColumnHelper } from '@tanstack/react-table';
import { Pager, ServerTable } from '../table/ServerTable';
import { PROPOSAL_STATES } from '~/lib/proposals/states';
import { type RiskLevel } from '~/lib/rules/levels';
import { LevelFilter, ListCount, ListError, SortChoice } from '../table/ListControls';
import { RiskBadge } from '../ui/RiskBadge';
import { useServerList, type ServerPage } from '../table/useServerList';
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
type Page = ServerPage<ProposalRow>;

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
  const { query, set, data, error, loading, table, pageCount, from } = useServerList<ProposalRow, ListQuery>({
    endpoint: '/api/proposals',
    initial,
    initialQuery,
    toParams,
    columns: COLUMNS,
    rowId: (r) => String(r.id),
    debounceMs: 200,
    failure: 'The list could not be loaded.',
  });

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
        <LevelFilter id="f-risk" label="Risk level" value={query.risk} onChange={(risk) => set({ risk })} />
        {canFile && (
          <a className="btn self-end justify-center" href="/proposals/new">
            File a proposal
          </a>
        )}
      </form>

      <div className="flex flex-wrap items-center justify-between gap-2 text-sm">
        <ListCount loading={loading} total={data.total} from={from} shown={data.items.length} things="Proposals" />
        <div className="flex items-center gap-2 md:hidden">
          <SortChoice
            id="m-sort"
            labelClassName="text-muted"
            sort={query.sort}
            dir={query.dir}
            choices={[
              ['updated', 'desc', 'Recently updated'],
              ['deadline', 'asc', 'Decision due soonest'],
              ['risk', 'desc', 'Highest risk'],
              ['co2e', 'desc', 'Largest CO2e'],
              ['reference', 'asc', 'Reference'],
            ]}
            onChange={(sort, dir) => set({ sort, dir })}
          />
        </div>
      </div>
      <ListError error={error} />

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
