/** Side panel of one parcel: area of record, land use, status flags with reasons, overlay, history. */
import { formatDate } from '~/lib/format/dates';
import { EVENT_KIND_LABELS, EVENT_VALUES } from '~/lib/gis/land-use-events';
import type { LandUseEventKind } from '~/lib/gis/land-use-history';
import { classLabel } from '~/lib/gis/reference-kinds';
import type { Flag, KindSummary, ParcelDetail } from './types';

const pct = (s: number) => `${(s * 100).toFixed(1)} %`;
const FLAG_TEXT = (f: Flag) =>
  f.value === true
    ? { mark: '✓', word: 'Yes' }
    : f.value === false
      ? { mark: '✕', word: 'No' }
      : { mark: '?', word: 'Cannot tell' };

function FlagRow({ label, flag }: { label: string; flag: Flag }) {
  const t = FLAG_TEXT(flag);
  return (
    <div>
      <dt className="font-medium">{label}</dt>
      <dd>
        <span aria-hidden="true">{t.mark} </span>
        {t.word}. <span className="text-muted">{flag.reason}</span>
      </dd>
    </div>
  );
}

function HistoryItem({ e }: { e: ParcelDetail['history'][number] }) {
  const kind = EVENT_KIND_LABELS[e.kind as LandUseEventKind] ?? e.kind;
  const value = e.value ? (EVENT_VALUES[e.kind as LandUseEventKind]?.[e.value] ?? e.value) : null;
  return (
    <li>
      <strong>{formatDate(e.date)}</strong> {kind}
      {value ? `: ${value}` : ''}
      {e.cultivation && e.kind === 'management' ? ' (cultivation)' : ''}
      <span className="block text-xs text-muted">
        Evidence: {e.evidence} · recorded {formatDate(e.recordedAt)}
        {e.recordedBy ? ` by ${e.recordedBy}` : ''}
      </span>
    </li>
  );
}

function Shares({ title, s, empty }: { title: string; s: KindSummary | undefined; empty: string }) {
  if (!s) return null;
  return (
    <div>
      <h4 className="text-sm font-semibold">
        {title}
        {s.layerVersion ? <span className="font-normal text-muted"> (layer v{s.layerVersion})</span> : null}
      </h4>
      {s.flag && (
        <p className="notice notice-warn my-1 text-sm">
          <span aria-hidden="true">⚠ </span>
          {s.flag}
        </p>
      )}
      {s.classes.length === 0 ? (
        <p className="text-sm text-muted">{empty}</p>
      ) : (
        <table className="data-table">
          <tbody>
            {s.classes.map((c) => (
              <tr key={c.class}>
                <td>{classLabel(c.class)}</td>
                <td className="num">{pct(c.share)}</td>
                <td className="num">{c.areaHa.toFixed(2)} ha</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </div>
  );
}

export function ParcelPanel({
  p,
  onClose,
  actions,
  recordForm,
}: {
  p: ParcelDetail;
  onClose: () => void;
  actions?: React.ReactNode;
  recordForm?: React.ReactNode;
}) {
  const o = p.overlay;
  return (
    <article aria-labelledby="parcel-heading" className="flex flex-col gap-3">
      <div className="flex items-start justify-between gap-2">
        <h2 id="parcel-heading" tabIndex={-1}>
          Parcel {p.reference}
        </h2>
        <button className="btn btn-quiet px-2 py-0.5 text-sm" onClick={onClose} aria-label="Close parcel details">
          Close
        </button>
      </div>
      {p.name && <p className="-mt-2 text-muted">{p.name}</p>}
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="font-medium">Area of record</dt>
        <dd>
          {p.areaHa.toFixed(2)} ha <span className="text-muted">(ellipsoidal, WGS 84)</span>
        </dd>
        {p.statedAreaHa !== null && (
          <>
            <dt className="font-medium">Stated area</dt>
            <dd>{p.statedAreaHa.toFixed(2)} ha</dd>
          </>
        )}
        <dt className="font-medium">Land use</dt>
        <dd>{p.landUse ?? 'not recorded'}</dd>
        <dt className="font-medium">Management</dt>
        <dd>{p.management ?? 'not recorded'}</dd>
        <dt className="font-medium">Climate region</dt>
        <dd>{o.climate?.dominant ? `${classLabel(o.climate.dominant)} (largest share)` : 'unknown'}</dd>
        {p.ownerRef && (
          <>
            <dt className="font-medium">Holding (private)</dt>
            <dd>{p.ownerRef}</dd>
          </>
        )}
        <dt className="font-medium">Source</dt>
        <dd>
          {p.source.kind === 'upload' ? `Upload “${p.source.fileName}”` : 'Drawn on the map'}
          {p.source.savedAt ? `, ${formatDate(p.source.savedAt)}` : ''}
        </dd>
      </dl>
      {actions}
      <section aria-labelledby="flags-heading">
        <h3 id="flags-heading" className="mb-1">
          Status on {formatDate(p.flags.asOf)}
        </h3>
        <dl className="flex flex-col gap-1 text-sm">
          <FlagRow label="Permanent grassland" flag={p.flags.permanentGrassland} />
          <FlagRow label="Uncultivated" flag={p.flags.uncultivated} />
          <FlagRow label="Never tilled (history)" flag={p.flags.neverTilled} />
        </dl>
      </section>
      <section aria-labelledby="overlay-heading" className="flex flex-col gap-2">
        <h3 id="overlay-heading">Context from reference layers</h3>
        <Shares title="Climate" s={o.climate} empty="No climate region." />
        <Shares title="Soil classes (area fractions)" s={o.soil} empty="No soil unit." />
        <Shares title="Designated sensitive grassland" s={o.sensitive} empty="None: not designated." />
        <Shares
          title="Never-tilled grassland (mapped)"
          s={o['never-tilled']}
          empty="Not inside mapped never-tilled grassland."
        />
        <Shares title="Slope" s={o.slope} empty="No slope class." />
        {o.region && (
          <Shares title="Accounting region (district)" s={o.region} empty="Outside every accounting region." />
        )}
      </section>
      <section aria-labelledby="history-heading" className="flex flex-col gap-2">
        <h3 id="history-heading">Land-use history</h3>
        {recordForm}
        {p.history.length === 0 ? (
          <p className="text-sm text-muted">Nothing recorded.</p>
        ) : (
          <ol className="flex flex-col gap-1 text-sm" aria-label="Events, newest first">
            {[...p.history].reverse().map((e) => (
              <HistoryItem key={e.id} e={e} />
            ))}
          </ol>
        )}
      </section>
      <section aria-labelledby="proposals-heading">
        <h3 id="proposals-heading" className="mb-1">
          Proposals
        </h3>
        {p.proposals.length === 0 ? (
          <p className="text-sm text-muted">No proposals concern this parcel.</p>
        ) : (
          <ul className="text-sm">
            {p.proposals.map((x) => (
              <li key={x.id}>
                {x.title} ({x.status})
              </li>
            ))}
          </ul>
        )}
      </section>
    </article>
  );
}
