/** Find a parcel by reference or name: the keyboard way to open a parcel's details. */
import { useEffect, useState } from 'react';
import { apiFetch } from '../ui/api-client';

export type ParcelHit = { id: number; reference: string; name: string | null; areaHa: number };

export function ParcelSearch({
  onPick,
  id = 'parcel-search',
  label = 'Find a parcel',
}: {
  onPick: (id: number, hit: ParcelHit) => void;
  id?: string;
  label?: string;
}) {
  const [q, setQ] = useState('');
  const [hits, setHits] = useState<ParcelHit[]>([]);
  useEffect(() => {
    const term = q.trim();
    if (!term) return setHits([]);
    const t = setTimeout(
      () =>
        void apiFetch<{ items: ParcelHit[] }>(`/api/parcels/search?q=${encodeURIComponent(term)}`).then(
          (d) => setHits(d.items),
          () => setHits([]),
        ),
      200,
    );
    return () => clearTimeout(t);
  }, [q]);
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
      </label>
      <input
        id={id}
        className="input"
        type="search"
        placeholder="Reference or field name"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        autoComplete="off"
      />
      {hits.length > 0 && (
        <ul
          className="max-h-48 overflow-y-auto rounded border border-line bg-white text-sm"
          aria-label="Matching parcels"
        >
          {hits.map((h) => (
            <li key={h.id}>
              <button
                type="button"
                className="w-full px-2 py-1 text-left hover:bg-sward-50 focus:bg-sward-50"
                onClick={() => (onPick(h.id, h), setQ(''))}
              >
                <strong>{h.reference}</strong> {h.name ?? ''}{' '}
                <span className="text-muted">{h.areaHa.toFixed(2)} ha</span>
              </button>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
