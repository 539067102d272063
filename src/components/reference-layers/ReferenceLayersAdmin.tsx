/** Admin view of the reference layers: every version of each kind, and publishing a draft. */
import { formatDate } from '~/lib/format/dates';
import { useCallback, useEffect, useState } from 'react';
import { classLabel } from '~/lib/gis/reference-kinds';
import { apiFetch, ApiError } from '../ui/api-client';

type Version = {
  id: number;
  version: number;
  status: 'draft' | 'published';
  current: boolean;
  classAttribute: string;
  classes: string[];
  featureCount: number;
  fileName: string | null;
  createdAt: string;
  createdBy: string | null;
  publishedAt: string | null;
  publishedBy: string | null;
  note: string | null;
};
type Kind = { kind: string; label: string; allowedClasses: string[] | null; versions: Version[] };

const statusText = (v: Version) => (v.current ? '● Current' : v.status === 'published' ? '○ Earlier, kept' : '✎ Draft');

export function ReferenceLayersAdmin() {
  const [kinds, setKinds] = useState<Kind[]>([]);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState<number | null>(null);
  const load = useCallback(
    () => apiFetch<{ kinds: Kind[] }>('/api/reference-layers').then((d) => setKinds(d.kinds)),
    [],
  );
  useEffect(() => void load(), [load]);

  async function publish(k: Kind, v: Version) {
    setBusy(v.id);
    setNote(null);
    try {
      const r = await apiFetch<{ timings: { overlayMs: number } }>(`/api/reference-layers/${v.id}/publish`, {
        body: {},
      });
      setNote({
        ok: true,
        text:
          `Version ${v.version} of ${k.label.toLowerCase()} is now current; ` +
          `every parcel was overlaid with it (${(r.timings.overlayMs / 1000).toFixed(1)} s).`,
      });
      await load();
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'Publishing failed.' });
    } finally {
      setBusy(null);
    }
  }

  return (
    <div className="flex flex-col gap-4">
      <p>
        <a className="btn" href="/admin/reference-layers/upload">
          Upload a reference layer
        </a>
      </p>
      {note && (
        <p className={note.ok ? 'notice' : 'notice notice-warn'} role={note.ok ? 'status' : 'alert'}>
          {note.ok ? '✓ ' : '⚠ '}
          {note.text}
        </p>
      )}
      {kinds.map((k) => (
        <section key={k.kind} className="panel" aria-labelledby={`kind-${k.kind}`}>
          <h2 id={`kind-${k.kind}`} className="mb-1">
            {k.label}
          </h2>
          {k.allowedClasses && (
            <p className="mb-2 text-xs text-muted">Classes: {k.allowedClasses.map(classLabel).join(', ')}.</p>
          )}
          {k.versions.length === 0 ? (
            <p className="text-sm text-muted">
              No version uploaded yet. Parcels show “not covered” for this layer until one is published.
            </p>
          ) : (
            <>
              {/* Phones get one card per version; the table needs the width of a tablet or more. */}
              <ul className="flex flex-col gap-2 md:hidden" aria-label={`Versions of ${k.label.toLowerCase()}`}>
                {k.versions.map((v) => (
                  <li key={v.id} className="rounded border border-line bg-white p-3 text-sm">
                    <p className="flex flex-wrap items-baseline justify-between gap-2">
                      <strong>v{v.version}</strong>
                      <span>{statusText(v)}</span>
                    </p>
                    <dl className="mt-1 grid grid-cols-[max-content_minmax(0,1fr)] gap-x-3 gap-y-0.5">
                      <dt className="text-muted">File</dt>
                      <dd className="[overflow-wrap:anywhere]">{v.fileName ?? '—'}</dd>
                      <dt className="text-muted">Classes</dt>
                      <dd>
                        {v.classes.map(classLabel).join(', ')}{' '}
                        <span className="text-xs text-muted">({v.classAttribute})</span>
                      </dd>
                      <dt className="text-muted">Features</dt>
                      <dd>{v.featureCount}</dd>
                      <dt className="text-muted">Uploaded</dt>
                      <dd>
                        {v.createdAt.slice(0, 10)}
                        {v.createdBy ? `, ${v.createdBy}` : ''}
                      </dd>
                      <dt className="text-muted">Published</dt>
                      <dd>
                        {v.publishedAt
                          ? `${v.publishedAt.slice(0, 10)}${v.publishedBy ? `, ${v.publishedBy}` : ''}`
                          : '—'}
                      </dd>
                    </dl>
                    {v.status === 'draft' && (
                      <button className="btn mt-2" disabled={busy !== null} onClick={() => void publish(k, v)}>
                        {busy === v.id ? 'Publishing…' : `Publish v${v.version}`}
                      </button>
                    )}
                  </li>
                ))}
              </ul>
              <div className="hidden overflow-x-auto md:block">
                <table className="data-table">
                  <thead>
                    <tr>
                      <th scope="col">Version</th>
                      <th scope="col">Status</th>
                      <th scope="col">File</th>
                      <th scope="col">Classes (column)</th>
                      <th scope="col" className="num">
                        Features
                      </th>
                      <th scope="col">Uploaded</th>
                      <th scope="col">Published</th>
                      <th scope="col">
                        <span className="sr-only">Action</span>
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {k.versions.map((v) => (
                      <tr key={v.id}>
                        <td>v{v.version}</td>
                        <td className="whitespace-nowrap">{statusText(v)}</td>
                        <td className="min-w-[10rem] [overflow-wrap:anywhere]">{v.fileName ?? '—'}</td>
                        <td>
                          {v.classes.map(classLabel).join(', ')}{' '}
                          <span className="text-xs text-muted">({v.classAttribute})</span>
                        </td>
                        <td className="num">{v.featureCount}</td>
                        <td>
                          {formatDate(v.createdAt)}
                          {v.createdBy ? `, ${v.createdBy}` : ''}
                        </td>
                        <td>
                          {v.publishedAt
                            ? `${formatDate(v.publishedAt)}${v.publishedBy ? `, ${v.publishedBy}` : ''}`
                            : '—'}
                        </td>
                        <td>
                          {v.status === 'draft' && (
                            <button className="btn" disabled={busy !== null} onClick={() => void publish(k, v)}>
                              {busy === v.id ? 'Publishing…' : `Publish v${v.version}`}
                            </button>
                          )}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            </>
          )}
        </section>
      ))}
    </div>
  );
}
