import type { UseFormRegister, UseFormWatch, FieldErrors } from 'react-hook-form';
import { CROPLAND_INPUT, CROPLAND_SYSTEMS, GRASSLAND_INPUT, GRASSLAND_MANAGEMENT, TILLAGE } from '~/lib/carbon';
import { CROP_INPUT_LABELS, GRASS_INPUT_LABELS, MANAGEMENT_LABELS, SYSTEM_LABELS, TILLAGE_LABELS } from './labels';
import type { CalculatorForm } from './form-model';

type Props = {
  side: 'before' | 'after';
  legend: string;
  register: UseFormRegister<CalculatorForm>;
  watch: UseFormWatch<CalculatorForm>;
  errors: FieldErrors<CalculatorForm>;
};

function Select({
  id,
  label,
  options,
  labels,
  reg,
  error,
}: {
  id: string;
  label: string;
  options: readonly string[];
  labels: Record<string, string>;
  reg: ReturnType<UseFormRegister<CalculatorForm>>;
  error?: string;
}) {
  return (
    <div className="field">
      <label htmlFor={id} className="text-sm font-medium text-muted">
        {label}
      </label>
      <select id={id} className="input" aria-invalid={!!error} {...reg}>
        {options.map((o) => (
          <option key={o} value={o}>
            {labels[o]}
          </option>
        ))}
      </select>
      {error && <p className="error-text">{error}</p>}
    </div>
  );
}

/** The land use and its IPCC management choices, on one side of the change. */
export function LandUseFields({ side, legend, register, watch, errors }: Props) {
  const use = watch(`${side}.landUse`);
  const err = errors[side];
  return (
    <fieldset className="flex flex-col gap-2 rounded border border-line p-3">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      <Select
        id={`${side}-use`}
        label="Land use"
        options={['grassland', 'cropland']}
        labels={{ grassland: 'Grassland', cropland: 'Cropland' }}
        reg={register(`${side}.landUse`)}
      />
      {use === 'grassland' ? (
        <>
          <Select
            id={`${side}-mgmt`}
            label="Management (F_MG)"
            options={GRASSLAND_MANAGEMENT}
            labels={MANAGEMENT_LABELS}
            reg={register(`${side}.management`)}
          />
          <Select
            id={`${side}-ginput`}
            label="Input (F_I)"
            options={GRASSLAND_INPUT}
            labels={GRASS_INPUT_LABELS}
            reg={register(`${side}.grassInput`)}
            error={err?.grassInput?.message}
          />
        </>
      ) : (
        <>
          <Select
            id={`${side}-system`}
            label="System (F_LU)"
            options={CROPLAND_SYSTEMS}
            labels={SYSTEM_LABELS}
            reg={register(`${side}.system`)}
          />
          <Select
            id={`${side}-tillage`}
            label="Tillage (F_MG)"
            options={TILLAGE}
            labels={TILLAGE_LABELS}
            reg={register(`${side}.tillage`)}
          />
          <Select
            id={`${side}-cinput`}
            label="Input (F_I)"
            options={CROPLAND_INPUT}
            labels={CROP_INPUT_LABELS}
            reg={register(`${side}.cropInput`)}
          />
        </>
      )}
    </fieldset>
  );
}
