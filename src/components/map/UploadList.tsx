/** The parcels saved by one upload (`/map?upload=<id>`): named, counted and listed; each opens on the map. */
export type UploadOnMap = {
  id: string;
  label: string;
  count: number;
  parcels: { id: number; reference: string; geometry: GeoJSON.MultiPolygon }[];
};

const SHOWN = 40;

export function UploadList({
  upload,
  onPick,
  onClose,
}: {
  upload: UploadOnMap;
  onPick: (id: number) => void;
  onClose: () => void;
}) {
  const more = upload.count - Math.min(SHOWN, upload.parcels.length);
  return (
    <section aria-labelledby="upload-heading" className="flex flex-col gap-1 border-b border-line pb-3 text-sm">
      <h2 id="upload-heading" className="text-base">
        Saved by this upload
      </h2>
      <p>
        <strong>{upload.label}</strong>: {upload.count.toLocaleString('en-GB')} parcel{upload.count === 1 ? '' : 's'},
        outlined on the map with a dashed vermilion line.
      </p>
      <ul className="flex max-h-48 flex-wrap gap-1 overflow-y-auto" aria-label="Parcels saved by this upload">
        {upload.parcels.slice(0, SHOWN).map((p) => (
          <li key={p.id}>
            <button type="button" className="tag cursor-pointer" onClick={() => onPick(p.id)}>
              {p.reference}
            </button>
          </li>
        ))}
      </ul>
      {more > 0 && (
        <p className="text-xs text-muted">
          and {more.toLocaleString('en-GB')} more; find any of them by reference above.
        </p>
      )}
      <button type="button" className="btn btn-quiet self-start" onClick={onClose}>
        Hide the outlines
      </button>
    </section>
  );
}
