/** Step 2: map the layer's columns to Swardkeep fields, with sample values beside each column. */
import { PARCEL_FIELD_LABELS } from '~/lib/gis/field-labels';
import { AREA_UNITS } from '~/lib/gis/area-units';
import { KIND_INFO, REFERENCE_KINDS } from '~/lib/gis/reference-kinds';
import type { Mapping, StagedLayer } from './types';

type Props = { purpose: 'parcels' | 'reference'; layer: StagedLayer; mapping: Mapping; onChange: (m: Mapping) => void };

const UNIT_LABELS: Record<string, string> = { ha: 'hectares', m2: 'square metres', acres: 'acres', decares: 'decares' };

function ColumnSelect({
  id,
  value,
  layer,
  onChange,
  required,
}: {
  id: string;
  value: string | undefined;
  layer: StagedLayer;
  onChange: (v: string | undefined) => void;
  required?: boolean;
}) {
  return (
    <select
      id={id}
      className="input"
      value={value ?? ''}
      onChange={(e) => onChange(e.target.value || undefined)}
      aria-required={required}
    >
      <option value="">{required ? 'Choose a column…' : '(not in this file)'}</option>
      {layer.columns.map((c) => (
        <option key={c.name} value={c.name}>
          {c.name}
          {c.samples.length ? ` — e.g. ${c.samples.slice(0, 2).join(', ')}` : ' — (empty)'}
        </option>
      ))}
    </select>
  );
}

export function MappingStep({ purpose, layer, mapping, onChange }: Props) {
  const set = (key: string) => (v: string | undefined) => onChange({ ...mapping, [key]: v });
  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <fieldset className="flex flex-col gap-3">
        <legend className="mb-2 font-semibold">Swardkeep field ← column of “{layer.name}”</legend>
        {purpose === 'reference' ? (
          <>
            <div className="field">
              <label htmlFor="map-kind" className="text-sm font-medium text-muted">
                Kind of layer
              </label>
              <select
                id="map-kind"
                className="input"
                value={mapping.kind ?? ''}
                onChange={(e) => set('kind')(e.target.value || undefined)}
              >
                <option value="">Choose…</option>
                {REFERENCE_KINDS.map((k) => (
                  <option key={k} value={k}>
                    {KIND_INFO[k].label}
                  </option>
                ))}
              </select>
              {mapping.kind && KIND_INFO[mapping.kind as keyof typeof KIND_INFO].classes && (
                <p className="text-xs text-muted">
                  Classes must be one of: {KIND_INFO[mapping.kind as keyof typeof KIND_INFO].classes!.join(', ')}.
                </p>
              )}
            </div>
            <div className="field">
              <label htmlFor="map-classAttribute" className="text-sm font-medium text-muted">
                Column holding the class
              </label>
              <ColumnSelect
                id="map-classAttribute"
                value={mapping.classAttribute}
                layer={layer}
                onChange={set('classAttribute')}
                required
              />
            </div>
            <div className="field">
              <label htmlFor="map-labelAttribute" className="text-sm font-medium text-muted">
                Column holding a name (optional)
              </label>
              <ColumnSelect
                id="map-labelAttribute"
                value={mapping.labelAttribute}
                layer={layer}
                onChange={set('labelAttribute')}
              />
            </div>
          </>
        ) : (
          <>
            {Object.entries(PARCEL_FIELD_LABELS).map(([key, label]) => (
              <div className="field" key={key}>
                <label htmlFor={`map-${key}`} className="text-sm font-medium text-muted">
                  {label}
                  {key === 'reference' ? ' (required)' : ''}
                </label>
                <ColumnSelect
                  id={`map-${key}`}
                  value={mapping[key]}
                  layer={layer}
                  onChange={set(key)}
                  required={key === 'reference'}
                />
              </div>
            ))}
            {(
              [
                [
                  'grassSinceDate',
                  'In grass since: one date for the whole file (optional)',
                  'Used where the column above is empty or not in the file; recorded as a dated "grassland" land use with this file as evidence.',
                ],
                [
                  'lastTillageDate',
                  'Last ploughed or tilled: one date for the whole file (optional)',
                  'Used where the tillage column is empty or not in the file; recorded as a dated tillage.',
                ],
              ] as const
            ).map(([key, label, hint]) => (
              <div className="field" key={key}>
                <label htmlFor={`map-${key}`} className="text-sm font-medium text-muted">
                  {label}
                </label>
                <input
                  id={`map-${key}`}
                  type="date"
                  className="input"
                  value={mapping[key] ?? ''}
                  onChange={(e) => set(key)(e.target.value || undefined)}
                  aria-describedby={`map-${key}-hint`}
                />
                <p id={`map-${key}-hint`} className="text-xs text-muted">
                  {hint}
                </p>
              </div>
            ))}
            <div className="field">
              <label htmlFor="map-statedAreaUnit" className="text-sm font-medium text-muted">
                Unit of the stated area
              </label>
              <select
                id="map-statedAreaUnit"
                className="input"
                value={mapping.statedAreaUnit ?? 'ha'}
                onChange={(e) => set('statedAreaUnit')(e.target.value)}
              >
                {AREA_UNITS.map((u) => (
                  <option key={u} value={u}>
                    {UNIT_LABELS[u]}
                  </option>
                ))}
              </select>
            </div>
          </>
        )}
      </fieldset>
      <section aria-labelledby="columns-heading" className="min-w-0">
        <h3 id="columns-heading" className="mb-2">
          Columns in the file, with samples
        </h3>
        <p className="mb-2 text-xs text-muted">
          Shapefile column names are cut to 10 characters; the samples show what each holds.
        </p>
        <div className="overflow-x-auto">
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Column</th>
                <th scope="col">Type</th>
                <th scope="col">Sample values</th>
              </tr>
            </thead>
            <tbody>
              {layer.columns.map((c) => (
                <tr key={c.name}>
                  <td className="font-mono text-xs">{c.name}</td>
                  <td>{c.kind}</td>
                  <td className="break-words">{c.samples.join(' · ') || '(empty)'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}

/** Suggests a mapping: the remembered one for this source, else obvious column names. */
export function suggestMapping(purpose: 'parcels' | 'reference', layer: StagedLayer): Mapping {
  if (layer.rememberedMapping)
    return Object.fromEntries(
      Object.entries(layer.rememberedMapping).map(([k, v]) => [k, typeof v === 'string' ? v : undefined]),
    );
  const find = (re: RegExp) => layer.columns.find((c) => re.test(c.name))?.name;
  if (purpose === 'reference')
    return { classAttribute: find(/^(class|klasse|code|type)$/i), labelAttribute: find(/^(name|label)$/i) };
  return {
    reference: find(/ref|parcel|^id$/i),
    name: find(/^name$/i),
    landUse: find(/land_?use|^use$/i),
    management: find(/manage/i),
    lastTillage: find(/till|plough/i),
    lastReseeding: find(/reseed|sown/i),
    grassSince: find(/grass_?since|in_?grass|since/i),
    ownerRef: find(/owner|holding/i),
    statedArea: find(/area|_ha$|hect/i),
    statedAreaUnit: 'ha',
  };
}
