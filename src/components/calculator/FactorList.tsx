import { factorKeyWords } from '~/lib/carbon/entry-words';
import { formatNumber } from './labels';

export type UsedFactor = {
  key: string;
  value: number;
  unit: string;
  role: string;
  status: 'confirmed' | 'unconfirmed';
  source: { document: string; volume?: string; chapter?: string; table: string; page?: string };
};

/** Every value the estimate used, with its source and whether anyone has checked it against the publication. */
export function FactorList({ factors }: { factors: UsedFactor[] }) {
  return (
    <div className="overflow-x-auto">
      <table className="data-table min-w-[560px]">
        <thead>
          <tr>
            <th scope="col">Value</th>
            <th scope="col" className="num">
              Used
            </th>
            <th scope="col">Source</th>
            <th scope="col">Checked</th>
          </tr>
        </thead>
        <tbody>
          {factors.map((f) => (
            <tr key={f.key + f.role}>
              <td>
                <span className="block">{f.role}</span>
                <span className="text-xs text-muted" title={f.key}>
                  {factorKeyWords(f.key)}
                </span>
              </td>
              <td className="num whitespace-nowrap">
                {formatNumber(f.value, f.value < 1 ? 4 : 2)} <span className="text-xs text-muted">{f.unit}</span>
              </td>
              <td className="text-xs">
                {[
                  f.source.document,
                  f.source.volume,
                  f.source.chapter,
                  f.source.table,
                  f.source.page ? `p. ${f.source.page}` : null,
                ]
                  .filter(Boolean)
                  .join(', ')}
              </td>
              <td>
                {f.status === 'confirmed' ? (
                  <span className="tag">✓ checked</span>
                ) : (
                  <span className="tag border-clay-700 text-clay-700">! not yet checked</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
