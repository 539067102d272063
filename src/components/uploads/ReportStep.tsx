/** Step 4: the per-feature validation report: counts, and every feature with something to say. */
import { useState } from 'react';
import { countOf, issueCountText } from '~/lib/gis/issue-words';
import type { Report } from './types';

const STATUS = {
  ok: { mark: '✓', word: 'Valid' },
  repaired: { mark: '⚒', word: 'Repaired' },
  rejected: { mark: '✕', word: 'Rejected' },
} as const;

export function ReportStep({
  report,
  purpose,
  uploadId,
}: {
  report: Report;
  purpose: 'parcels' | 'reference';
  uploadId: string;
}) {
  const [filter, setFilter] = useState<'all' | 'repaired' | 'rejected'>('all');
  const s = report.summary;
  const rows = report.features.filter((f) => filter === 'all' || f.status === filter);
  const noun = purpose === 'parcels' ? 'parcels' : 'features';
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-muted">
        Layer “{report.layer}”, read as {report.crs.name}
        {report.crs.epsg ? ` (EPSG:${report.crs.epsg})` : ''} and converted to WGS 84. Areas are ellipsoidal (WGS 84).
      </p>
      <ul className="grid grid-cols-2 gap-2 sm:grid-cols-4" aria-label="Summary">
        <li className="panel py-2">
          <div className="text-xs text-muted">In the file</div>
          <div className="text-lg font-semibold">{s.total}</div>
        </li>
        <li className="panel py-2">
          <div className="text-xs text-muted">✓ Valid</div>
          <div className="text-lg font-semibold">{s.ok}</div>
        </li>
        <li className="panel py-2">
          <div className="text-xs text-muted">⚒ Repaired, will be saved</div>
          <div className="text-lg font-semibold">{s.repaired}</div>
        </li>
        <li className="panel border-clay-700 py-2">
          <div className="text-xs text-muted">✕ Rejected, not saved</div>
          <div className="text-lg font-semibold">{s.rejected}</div>
        </li>
      </ul>
      <p className="text-sm">
        <a href={`/api/uploads/${uploadId}/report.csv`} download>
          Download the full report (CSV)
        </a>
      </p>
      {Object.keys(s.byCode).length > 0 && (
        <p className="text-sm">
          Found:{' '}
          {Object.entries(s.byCode)
            .map(([code, n]) => issueCountText(code, n))
            .join(' · ')}
        </p>
      )}
      {report.features.length > 0 && (
        <>
          <div role="group" aria-label="Show" className="flex flex-wrap gap-3 text-sm">
            {(['all', 'rejected', 'repaired'] as const).map((f) => (
              <label key={f} className="flex items-center gap-1">
                <input type="radio" name="report-filter" checked={filter === f} onChange={() => setFilter(f)} />
                {f === 'all' ? 'All with remarks' : STATUS[f].word}
              </label>
            ))}
          </div>
          {/* Phones get one card per feature; the table needs more width than 390 px. */}
          <div
            className="max-h-[28rem] overflow-auto sm:hidden"
            role="region"
            aria-label={`${noun} with remarks`}
            tabIndex={0}
          >
            <ul className="flex flex-col gap-2">
              {rows.map((f) => (
                <li key={f.index} className="rounded border border-line bg-white p-2 text-sm">
                  <p className="flex flex-wrap items-baseline justify-between gap-x-3">
                    <span>
                      <span className="text-muted">#{f.index + 1}</span>{' '}
                      <strong className="[overflow-wrap:anywhere]">{f.reference ?? '—'}</strong>
                    </span>
                    <span className={f.status === 'rejected' ? 'text-clay-700' : undefined}>
                      <span aria-hidden="true">{STATUS[f.status].mark} </span>
                      {STATUS[f.status].word}
                    </span>
                  </p>
                  <ul className="mt-1 list-disc pl-5">
                    {f.issues.map((i, n) => (
                      <li key={n}>{i.message}</li>
                    ))}
                  </ul>
                  {f.areaHa !== null && (
                    <p className="mt-1 text-xs text-muted">Measured area {f.areaHa.toFixed(2)} ha</p>
                  )}
                </li>
              ))}
            </ul>
          </div>
          <div
            className="hidden max-h-[28rem] overflow-auto rounded border border-line bg-white sm:block"
            tabIndex={0}
            role="region"
            aria-label={`${noun} with remarks`}
          >
            <table className="data-table">
              <caption className="sr-only">{noun} with remarks</caption>
              <thead className="sticky top-0 bg-white">
                <tr>
                  <th scope="col">#</th>
                  <th scope="col">Reference</th>
                  <th scope="col">Status</th>
                  <th scope="col">What was found</th>
                  <th scope="col" className="num">
                    Measured area, ha
                  </th>
                </tr>
              </thead>
              <tbody>
                {rows.map((f) => (
                  <tr key={f.index}>
                    <td className="num">{f.index + 1}</td>
                    <td>{f.reference ?? '—'}</td>
                    <td className={f.status === 'rejected' ? 'whitespace-nowrap text-clay-700' : 'whitespace-nowrap'}>
                      <span aria-hidden="true">{STATUS[f.status].mark} </span>
                      {STATUS[f.status].word}
                    </td>
                    <td>
                      <ul>
                        {f.issues.map((i, n) => (
                          <li key={n}>{i.message}</li>
                        ))}
                      </ul>
                    </td>
                    <td className="num">{f.areaHa === null ? '—' : f.areaHa.toFixed(2)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {report.omitted > 0 && (
            <p className="text-xs text-muted">
              {countOf(
                report.omitted,
                `more ${noun.replace(/s$/, '')} with remarks is`,
                `more ${noun} with remarks are`,
              )}{' '}
              not listed here; the CSV report lists every one.
            </p>
          )}
        </>
      )}
    </div>
  );
}
