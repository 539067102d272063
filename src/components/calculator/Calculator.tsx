import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { CLIMATE_REGIONS, GWP_SETS } from '~/lib/carbon';
import { apiFetch, ApiError } from '../ui/api-client';
import { Field } from '../ui/Field';
import { downloadEstimate } from './download';
import { inputRows } from './EstimateInputs';
import { EstimateResults, type Estimate } from './EstimateResults';
import {
  calculatorFormSchema,
  DEFAULT_FORM,
  toRequestBody,
  type CalculatorForm,
  type CalculatorValues,
} from './form-model';
import { CLIMATE_LABELS, GWP_LABELS } from './labels';
import { LandUseFields } from './LandUseFields';
import { SoilFields } from './SoilFields';

type SetOption = { id: string; title: string; isDefault: boolean; version: number; unconfirmed: number };

export function Calculator({ sets }: { sets: SetOption[] }) {
  const [result, setResult] = useState<{ estimate: Estimate; years: number; values: CalculatorValues } | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const defaultSet = sets.find((s) => s.isDefault)?.id ?? DEFAULT_FORM.factorSet;
  const { register, handleSubmit, control, watch, formState } = useForm<CalculatorForm, unknown, CalculatorValues>({
    resolver: zodResolver(calculatorFormSchema),
    defaultValues: { ...DEFAULT_FORM, factorSet: defaultSet },
  });
  const errors = formState.errors;
  const setTitle = (id: string) => {
    const s = sets.find((x) => x.id === id);
    return s ? `${s.title}, version ${s.version}` : id;
  };
  const withUncertainty = watch('withUncertainty');

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      const estimate = await apiFetch<Estimate>('/api/estimates', { body: toRequestBody(values) });
      setResult({ estimate, years: values.transitionYears, values });
    } catch (e) {
      setResult(null);
      setFailure(e instanceof ApiError ? e.message : 'The estimate could not be computed.');
    }
  });

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(300px,380px)_1fr] print:block">
      <form
        onSubmit={onSubmit}
        noValidate
        className="no-print panel flex min-w-0 flex-col gap-3 self-start"
        aria-label="Estimate inputs"
      >
        <Field label="Factor set" htmlFor="factorSet">
          <select id="factorSet" className="input" {...register('factorSet')}>
            {sets.map((s) => (
              <option key={s.id} value={s.id}>
                {s.title} (v{s.version}
                {s.unconfirmed ? `, ${s.unconfirmed} tables not yet checked` : ''})
              </option>
            ))}
          </select>
        </Field>
        <Field label="IPCC climate region" htmlFor="climate">
          <select id="climate" className="input" {...register('climate')}>
            {CLIMATE_REGIONS.map((c) => (
              <option key={c} value={c}>
                {CLIMATE_LABELS[c]}
              </option>
            ))}
          </select>
        </Field>
        <SoilFields control={control} register={register} errors={errors} />
        <Field label="Area, ha" htmlFor="areaHa" error={errors.areaHa?.message}>
          <input
            id="areaHa"
            type="number"
            step="any"
            min="0"
            className="input"
            aria-invalid={!!errors.areaHa}
            {...register('areaHa')}
          />
        </Field>
        <LandUseFields side="before" legend="Now" register={register} watch={watch} errors={errors} />
        <LandUseFields side="after" legend="Proposed" register={register} watch={watch} errors={errors} />
        <details className="rounded border border-line p-3">
          <summary className="cursor-pointer text-sm font-semibold">Method options</summary>
          <div className="mt-2 flex flex-col gap-2">
            <Field label="Transition period D, years" htmlFor="transitionYears" error={errors.transitionYears?.message}>
              <input
                id="transitionYears"
                type="number"
                min="1"
                max="100"
                className="input"
                {...register('transitionYears')}
              />
            </Field>
            <Field label="Global warming potentials" htmlFor="gwp">
              <select id="gwp" className="input" {...register('gwp')}>
                {GWP_SETS.map((g) => (
                  <option key={g} value={g}>
                    {GWP_LABELS[g]}
                  </option>
                ))}
              </select>
            </Field>
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" {...register('biomass')} /> Count biomass lost and gained at conversion
            </label>
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" {...register('n2o')} /> Count N2O from mineralised nitrogen
            </label>
          </div>
        </details>
        <fieldset className="rounded border border-line p-3">
          <legend className="px-1 text-sm font-semibold">Uncertainty</legend>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" {...register('withUncertainty')} /> 95% range by Monte Carlo
          </label>
          {withUncertainty && (
            <div className="mt-2 grid grid-cols-2 gap-2">
              <Field label="Runs" htmlFor="runs" error={errors.runs?.message}>
                <input id="runs" type="number" min="100" max="20000" className="input" {...register('runs')} />
              </Field>
              <Field label="Seed" htmlFor="seed" error={errors.seed?.message}>
                <input id="seed" type="number" min="0" className="input" {...register('seed')} />
              </Field>
            </div>
          )}
        </fieldset>
        <button type="submit" className="btn self-start" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Computing…' : 'Estimate'}
        </button>
        {failure && (
          <p className="notice notice-warn text-sm" role="alert">
            {failure}
          </p>
        )}
      </form>
      <div className="min-w-0">
        {result ? (
          <EstimateResults
            result={result.estimate}
            transitionYears={result.years}
            inputs={inputRows(result.values, setTitle(result.values.factorSet))}
            onDownload={() =>
              downloadEstimate(
                inputRows(result.values, setTitle(result.values.factorSet)),
                toRequestBody(result.values),
                result.estimate,
              )
            }
          />
        ) : (
          <div className="no-print panel text-sm text-muted">
            <p>
              Choose the region, soils and the change, then press <strong>Estimate</strong>.
            </p>
            <p className="mt-2">
              The estimate follows the IPCC Tier 1 stock-change method (2006 Guidelines, Vol 4, Eq 2.25): reference
              stock × land-use, management and input factors, changing linearly over the transition period. It adds
              biomass lost at conversion and N2O from mineralised nitrogen, in CO2-equivalent.
            </p>
          </div>
        )}
      </div>
    </div>
  );
}
