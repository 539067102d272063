/**
 * The desktop table and the pager of a list paged and sorted on the server (tanstack table in
 * manual mode): sortable headers as buttons with aria-sort, numeric columns right-aligned
 * (column meta `num`), Previous / Next and a page-size menu.
 */
import { flexRender, type Table } from '@tanstack/react-table';

const isNum = (meta: unknown) => (meta as { num?: boolean } | undefined)?.num === true;

export function ServerTable<T>({
  table,
  sortable,
  numClass = 'num',
}: {
  table: Table<T>;
  sortable: (columnId: string) => boolean;
  numClass?: string;
}) {
  return (
    <div className="panel hidden overflow-x-auto p-0 md:block">
      <table className="data-table">
        <thead>
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id}>
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th
                    key={h.id}
                    scope="col"
                    className={isNum(h.column.columnDef.meta) ? 'num' : undefined}
                    aria-sort={sorted ? (sorted === 'asc' ? 'ascending' : 'descending') : undefined}
                  >
                    {sortable(h.column.id) ? (
                      <button
                        type="button"
                        className="font-semibold hover:underline"
                        onClick={h.column.getToggleSortingHandler()}
                      >
                        {flexRender(h.column.columnDef.header, h.getContext())}
                        {sorted === 'asc' ? ' ▲' : sorted === 'desc' ? ' ▼' : ''}
                      </button>
                    ) : (
                      flexRender(h.column.columnDef.header, h.getContext())
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id}>
              {r.getVisibleCells().map((c) => (
                <td key={c.id} className={isNum(c.column.columnDef.meta) ? numClass : undefined}>
                  {flexRender(c.column.columnDef.cell, c.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function Pager<T>({
  table,
  page,
  pageCount,
  pageSize,
  sizes,
  id,
}: {
  table: Table<T>;
  page: number;
  pageCount: number;
  pageSize: number;
  sizes: number[];
  id: string;
}) {
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center gap-2 text-sm">
      <button
        type="button"
        className="btn btn-quiet"
        disabled={!table.getCanPreviousPage()}
        onClick={() => table.previousPage()}
      >
        Previous
      </button>
      <span>
        Page {page} of {pageCount}
      </span>
      <button
        type="button"
        className="btn btn-quiet"
        disabled={!table.getCanNextPage()}
        onClick={() => table.nextPage()}
      >
        Next
      </button>
      <label htmlFor={id} className="ml-auto text-muted">
        Per page
      </label>
      <select id={id} className="input" value={pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
        {sizes.map((n) => (
          <option key={n} value={n}>
            {n}
          </option>
        ))}
      </select>
    </nav>
  );
}
