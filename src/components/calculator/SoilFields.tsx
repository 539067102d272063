import { useFieldArray, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { SOIL_TYPES } from '~/lib/carbon';
import { SOIL_LABELS } from './labels';
import type { CalculatorForm } from './form-model';

type Props = {
  control: Control<CalculatorForm>;
  register: UseFormRegister<CalculatorForm>;
  errors: FieldErrors<CalculatorForm>;
};

/** Soil classes under the area and their shares, in percent. */
export function SoilFields({ control, register, errors }: Props) {
  const { fields, append, remove } = useFieldArray({ control, name: 'soils' });
  return (
    <fieldset className="flex flex-col gap-2 rounded border border-line p-3">
      <legend className="px-1 text-sm font-semibold">Soils under the area</legend>
      {fields.map((f, i) => (
        <div key={f.id} className="grid grid-cols-[minmax(0,1fr)_5rem] items-end gap-2">
          <div className="field min-w-0">
            <label htmlFor={`soil-${i}`} className="text-sm font-medium text-muted">
              Soil class {i + 1}
            </label>
            <select id={`soil-${i}`} className="input w-full" {...register(`soils.${i}.type`)}>
              {SOIL_TYPES.map((s) => (
                <option key={s} value={s}>
                  {SOIL_LABELS[s]}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor={`soil-pct-${i}`} className="text-sm font-medium text-muted">
              Share %
            </label>
            <input
              id={`soil-pct-${i}`}
              type="number"
              step="any"
              min="0"
              max="100"
              className="input w-full"
              aria-invalid={!!errors.soils?.[i]?.percent}
              {...register(`soils.${i}.percent`)}
            />
          </div>
          {fields.length > 1 && (
            <button
              type="button"
              className="btn btn-quiet col-span-2 justify-self-end px-2 py-1 text-sm"
              aria-label={`Remove soil class ${i + 1}`}
              onClick={() => remove(i)}
            >
              Remove
            </button>
          )}
        </div>
      ))}
      {errors.soils?.root?.message && <p className="error-text">{errors.soils.root.message}</p>}
      {errors.soils?.message && <p className="error-text">{errors.soils.message}</p>}
      {fields.length < SOIL_TYPES.length && (
        <button
          type="button"
          className="btn btn-quiet self-start"
          onClick={() => append({ type: 'sandy', percent: 0 })}
        >
          Add a soil class
        </button>
      )}
    </fieldset>
  );
}
