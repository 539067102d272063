/** The legend: parcels plus each reference layer, switched on and off, every class named and symbolised. */
import { Swatch } from './Swatch';
import type { LegendKind } from './types';

type Props = {
  legend: LegendKind[];
  visible: Set<string>;
  onToggle: (kind: string) => void;
  parcelMinZoom: number;
  showUpload?: boolean;
};

export function Legend({ legend, visible, onToggle, parcelMinZoom, showUpload = false }: Props) {
  return (
    <section aria-labelledby="legend-heading" className="flex flex-col gap-2 text-sm">
      <h2 id="legend-heading" className="text-base">
        Layers
      </h2>
      <div className="flex items-center gap-2">
        <Swatch colour="#1d2320" pattern="outline" id="sw-parcels" />
        <span>Parcels (boundaries from zoom {parcelMinZoom}; click one for details)</span>
      </div>
      <div className="flex items-center gap-2">
        <svg width="22" height="16" aria-hidden="true" className="shrink-0">
          <rect
            x="1"
            y="1"
            width="20"
            height="14"
            fill="none"
            stroke="#1d2320"
            strokeWidth="1.5"
            strokeDasharray="4 3"
          />
        </svg>
        <span>Parcel now in arable use (dashed)</span>
      </div>
      <div className="flex items-center gap-2">
        <svg width="22" height="16" aria-hidden="true" className="shrink-0">
          <rect x="1" y="1" width="20" height="14" fill="none" stroke="#1d2320" strokeWidth="1" />
          <rect x="8" y="5" width="6" height="6" fill="#f6f4ee" stroke="#1d2320" strokeWidth="1" />
        </svg>
        <span>
          Small square inside a parcel: a hole in its boundary (a pond or yard left out of the parcel and its area)
        </span>
      </div>
      <div className="flex items-center gap-2">
        <svg width="22" height="16" aria-hidden="true" className="shrink-0">
          <rect x="2" y="2" width="18" height="12" fill="none" stroke="#ffffff" strokeWidth="4" />
          <rect x="2" y="2" width="18" height="12" fill="none" stroke="#1f5a85" strokeWidth="2" />
        </svg>
        <span>Parcel you opened (thick blue outline)</span>
      </div>
      {showUpload && (
        <div className="flex items-center gap-2">
          <svg width="22" height="16" aria-hidden="true" className="shrink-0">
            <rect x="2" y="2" width="18" height="12" fill="none" stroke="#ffffff" strokeWidth="4" />
            <rect
              x="2"
              y="2"
              width="18"
              height="12"
              fill="none"
              stroke="#D55E00"
              strokeWidth="2"
              strokeDasharray="6 2"
            />
          </svg>
          <span>Saved by the upload listed above (dashed vermilion outline)</span>
        </div>
      )}
      {legend.map((k) => {
        const classes = Object.entries(k.classes);
        return (
          <fieldset key={k.kind} className="border-t border-line pt-2">
            <legend className="sr-only">{k.label}</legend>
            <label className="flex items-center gap-2 font-medium">
              <input
                type="checkbox"
                checked={visible.has(k.kind)}
                onChange={() => onToggle(k.kind)}
                disabled={k.version === null}
              />
              {k.label}
              <span className="text-xs font-normal text-muted">
                {k.version === null ? '(not published yet)' : `v${k.version}`}
              </span>
            </label>
            {classes.length > 0 && (
              <ul className="mt-1 flex flex-col gap-0.5 pl-6">
                {classes.map(([cls, e]) => (
                  <li key={cls} className="flex items-center gap-2">
                    <Swatch
                      colour={e.colour}
                      pattern={e.pattern}
                      id={`sw-${k.kind}-${cls}`}
                      dashed={k.kind === 'sensitive' || k.kind === 'never-tilled'}
                    />
                    {e.label}
                  </li>
                ))}
              </ul>
            )}
          </fieldset>
        );
      })}
    </section>
  );
}
