/** A land use and its IPCC management choices in the engine's terms (controlled; the calculator's labels). */
import {
  CROPLAND_INPUT,
  CROPLAND_SYSTEMS,
  GRASSLAND_INPUT,
  GRASSLAND_MANAGEMENT,
  TILLAGE,
  type LandUseState,
} from '~/lib/carbon/types';
import {
  CROP_INPUT_LABELS,
  GRASS_INPUT_LABELS,
  MANAGEMENT_LABELS,
  SYSTEM_LABELS,
  TILLAGE_LABELS,
} from '../calculator/labels';

export const DEFAULT_CROPLAND: LandUseState = {
  landUse: 'cropland',
  system: 'long-term-cultivated',
  tillage: 'full',
  input: 'medium',
};
export const DEFAULT_GRASSLAND: LandUseState = { landUse: 'grassland', management: 'nominal', input: 'medium' };

function Select({
  id,
  label,
  value,
  options,
  labels,
  onChange,
}: {
  id: string;
  label: string;
  value: string;
  options: readonly string[];
  labels: Record<string, string>;
  onChange: (v: string) => void;
}) {
  return (
    <div className="field">
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
      </label>
      <select id={id} className="input" value={value} onChange={(e) => onChange(e.target.value)}>
        {options.map((o) => (
          <option key={o} value={o}>
            {labels[o]}
          </option>
        ))}
      </select>
    </div>
  );
}

export function UseFields({
  id,
  legend,
  value,
  onChange,
  error,
}: {
  id: string;
  legend: string;
  value: LandUseState;
  onChange: (v: LandUseState) => void;
  error?: string;
}) {
  return (
    <fieldset className="grid gap-2 rounded border border-line p-3 sm:grid-cols-2">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      <Select
        id={`${id}-use`}
        label="Land use"
        value={value.landUse}
        options={['grassland', 'cropland']}
        labels={{ grassland: 'Grassland', cropland: 'Cropland' }}
        onChange={(v) => onChange(v === 'grassland' ? DEFAULT_GRASSLAND : DEFAULT_CROPLAND)}
      />
      {value.landUse === 'grassland' ? (
        <>
          <Select
            id={`${id}-mgmt`}
            label="Management (IPCC F_MG)"
            value={value.management}
            options={GRASSLAND_MANAGEMENT}
            labels={MANAGEMENT_LABELS}
            onChange={(v) => onChange({ ...value, management: v as typeof value.management })}
          />
          <Select
            id={`${id}-ginput`}
            label="Input (IPCC F_I)"
            value={value.input}
            options={GRASSLAND_INPUT}
            labels={GRASS_INPUT_LABELS}
            onChange={(v) => onChange({ ...value, input: v as typeof value.input })}
          />
        </>
      ) : (
        <>
          <Select
            id={`${id}-system`}
            label="System (IPCC F_LU)"
            value={value.system}
            options={CROPLAND_SYSTEMS}
            labels={SYSTEM_LABELS}
            onChange={(v) => onChange({ ...value, system: v as typeof value.system })}
          />
          <Select
            id={`${id}-tillage`}
            label="Tillage (IPCC F_MG)"
            value={value.tillage}
            options={TILLAGE}
            labels={TILLAGE_LABELS}
            onChange={(v) => onChange({ ...value, tillage: v as typeof value.tillage })}
          />
          <Select
            id={`${id}-cinput`}
            label="Input (IPCC F_I)"
            value={value.input}
            options={CROPLAND_INPUT}
            labels={CROP_INPUT_LABELS}
            onChange={(v) => onChange({ ...value, input: v as typeof value.input })}
          />
        </>
      )}
      {error && (
        <p className="error-text sm:col-span-2" role="alert">
          {error}
        </p>
      )}
    </fieldset>
  );
}
