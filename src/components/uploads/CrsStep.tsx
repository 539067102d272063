/** Step 3: confirm the detected coordinate reference system or pick one by EPSG code or name. */
import { useEffect, useState } from 'react';
import { apiFetch } from '../ui/api-client';
import type { StagedLayer } from './types';

type Hit = { epsg: number; name: string; kind: string; areaOfUse: string };
type Props = { layer: StagedLayer; epsg: number | null; onChange: (epsg: number | null) => void };

export function CrsStep({ layer, epsg, onChange }: Props) {
  const [q, setQ] = useState('');
  const [hits, setHits] = useState<Hit[]>([]);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    const term = q.trim();
    if (!term) return setHits([]);
    const t = setTimeout(() => {
      apiFetch<{ items: Hit[] }>(`/api/crs?q=${encodeURIComponent(term)}&limit=15`)
        .then((d) => (setHits(d.items), setError(null)))
        .catch((e: Error) => setError(e.message));
    }, 200);
    return () => clearTimeout(t);
  }, [q]);
  const detected = layer.crs;
  return (
    <div className="flex flex-col gap-3">
      {detected ? (
        <p className="notice">
          <span aria-hidden="true">✓ </span>The file declares <strong>{detected.name}</strong>
          {detected.epsg ? ` (EPSG:${detected.epsg})` : ''}, read from its{' '}
          {detected.source === 'prj' ? '.prj' : 'GeoJSON'}. Keep it, or choose another below if you know it is wrong.
        </p>
      ) : (
        <p className="notice notice-warn" role="status">
          <span aria-hidden="true">⚠ </span>
          {layer.crsNote}
        </p>
      )}
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-semibold">Coordinate reference system</legend>
        {detected && (
          <label className="flex items-start gap-2">
            <input type="radio" name="crs" checked={epsg === null} onChange={() => onChange(null)} />
            <span>Use the declared system: {detected.name}</span>
          </label>
        )}
        {epsg !== null && !hits.some((h) => h.epsg === epsg) && (
          <label className="flex items-start gap-2">
            <input type="radio" name="crs" checked onChange={() => onChange(epsg)} />
            <span>EPSG:{epsg} (chosen)</span>
          </label>
        )}
        <div className="field mt-1">
          <label htmlFor="crs-search" className="text-sm font-medium text-muted">
            Find by EPSG code or name (e.g. 27700, “utm 28n”, “lambert 93”)
          </label>
          <input
            id="crs-search"
            className="input"
            type="search"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            autoComplete="off"
          />
        </div>
        {error && (
          <p className="error-text" role="alert">
            {error}
          </p>
        )}
        {hits.length > 0 && (
          <ul
            className="flex max-h-72 flex-col gap-1 overflow-y-auto rounded border border-line bg-white p-2"
            aria-label="Matching coordinate systems"
          >
            {hits.map((h) => (
              <li key={h.epsg}>
                <label className="flex items-start gap-2 text-sm">
                  <input type="radio" name="crs" checked={epsg === h.epsg} onChange={() => onChange(h.epsg)} />
                  <span>
                    <strong>EPSG:{h.epsg}</strong> {h.name} <span className="text-muted">({h.kind})</span>
                    <span className="block text-xs text-muted">{h.areaOfUse.slice(0, 160)}</span>
                  </span>
                </label>
              </li>
            ))}
          </ul>
        )}
      </fieldset>
    </div>
  );
}
