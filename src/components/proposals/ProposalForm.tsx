/**
 * Filing or changing a proposal: react-hook-form, checked by the API with its own schema (proposalFieldsSchema,
 * whose messages are shown beside each field; the island carries no zod, see "Script budgets" in DEVELOPERS.md),
 * parcels picked by reference or on the map (optionally a drawn part), the proposed use in the engine's terms.
 */
import { useCallback, useEffect, useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import type { z } from 'zod';
import type { proposalFieldsSchema } from '~/lib/api/proposals';
import { ParcelSearch } from '../map/ParcelSearch';
import { Field } from '../ui/Field';
import { ApiError, apiFetch } from '../ui/api-client';
import { PickMap, type Picked } from './PickMap';
import { DEFAULT_CROPLAND, UseFields } from './UseFields';
import { hectares, INTEREST_LABELS } from './words';

type Input = z.input<typeof proposalFieldsSchema>;
type Values = z.output<typeof proposalFieldsSchema>;
export type FormStart = { id: number; version: number; values: Values; picked: Picked[] } | null;

const EMPTY: Input = {
  title: '',
  description: '',
  startYear: new Date().getUTCFullYear() + 1,
  parcels: [],
  proposed: DEFAULT_CROPLAND,
  applicant: { name: '', contact: '', interest: 'owner' },
};

export function ProposalForm({ start }: { start: FormStart }) {
  const [picked, setPicked] = useState<Picked[]>(start?.picked ?? []);
  const [drawingFor, setDrawingFor] = useState<number | null>(null);
  const [failure, setFailure] = useState<{ conflict: boolean; text: string } | null>(null);
  const { register, handleSubmit, control, setValue, setError, clearErrors, formState } = useForm<Input>({
    defaultValues: start?.values ?? EMPTY,
  });
  const errors = formState.errors;

  // The form's `parcels` follow the chosen list (validated again once the form has been sent).
  useEffect(() => {
    setValue(
      'parcels',
      picked.map((p) => ({ parcelId: p.parcelId, ...(p.part ? { part: p.part } : {}) })),
      { shouldValidate: formState.isSubmitted },
    );
  }, [picked, setValue, formState.isSubmitted]);
  const sync = setPicked;
  const add = useCallback((p: { parcelId: number; reference: string; areaHa: number | null }) => {
    setPicked((cur) => (cur.some((x) => x.parcelId === p.parcelId) ? cur : [...cur, p]));
  }, []);
  const onDrawn = useCallback((parcelId: number, part: GeoJSON.Polygon) => {
    setPicked((cur) => cur.map((x) => (x.parcelId === parcelId ? { ...x, part } : x)));
    setDrawingFor(null);
  }, []);

  // The server's messages from the last try are cleared first: fields without rules (parcels) would keep them and block the form.
  const onSubmit = (event: React.FormEvent<HTMLFormElement>) => {
    clearErrors();
    return send(event);
  };
  const send = handleSubmit(async (values) => {
    setFailure(null);
    try {
      const r = start
        ? await apiFetch<{ id: number }>(`/api/proposals/${start.id}`, {
            method: 'PATCH',
            body: { ...values, version: start.version },
          })
        : await apiFetch<{ id: number }>('/api/proposals', { body: values });
      window.location.href = `/proposals/${r.id}`;
    } catch (e) {
      if (e instanceof ApiError && e.status === 422 && e.issues.length) {
        for (const i of e.issues)
          setError((i.path.length > 1 && i.path[0] === 'parcels' ? 'parcels' : i.path.join('.')) as never, {
            message: i.message,
          });
        setFailure({ conflict: false, text: 'Nothing was saved: see the messages beside the fields.' });
      } else if (e instanceof ApiError && e.status === 409 && /someone else/i.test(e.message))
        setFailure({ conflict: true, text: e.message });
      else
        setFailure({ conflict: false, text: e instanceof ApiError ? e.message : 'The proposal could not be saved.' });
    }
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]"
      aria-label={start ? 'Change the proposal' : 'File a proposal'}
    >
      <div className="flex min-w-0 flex-col gap-3">
        <section className="panel flex flex-col gap-3" aria-labelledby="f-what">
          <h2 id="f-what">The proposal</h2>
          <Field label="Title" htmlFor="title" error={errors.title?.message}>
            <input id="title" className="input" aria-invalid={!!errors.title} {...register('title')} />
          </Field>
          <Field label="Description of the proposed change" htmlFor="description" error={errors.description?.message}>
            <textarea
              id="description"
              className="input"
              rows={4}
              aria-invalid={!!errors.description}
              {...register('description')}
            />
          </Field>
          <Field label="Start year" htmlFor="startYear" error={errors.startYear?.message}>
            <input
              id="startYear"
              className="input max-w-32"
              type="number"
              min={2000}
              max={2100}
              aria-invalid={!!errors.startYear}
              {...register('startYear', { valueAsNumber: true })}
            />
          </Field>
          <Controller
            control={control}
            name="proposed"
            render={({ field }) => (
              <UseFields
                id="proposed"
                legend="Proposed use and management (IPCC Tier 1 classes)"
                value={field.value as Values['proposed']}
                onChange={field.onChange}
                error={errors.proposed?.message}
              />
            )}
          />
        </section>
        <section className="panel flex flex-col gap-3" aria-labelledby="f-applicant">
          <h2 id="f-applicant">Applicant</h2>
          <p className="text-sm text-muted">
            Kept private: shown only to planners, assessors and administrators, never on public pages, map tiles or
            exports.
          </p>
          <Field label="Name" htmlFor="applicant-name" error={errors.applicant?.name?.message}>
            <input
              id="applicant-name"
              className="input"
              autoComplete="off"
              aria-invalid={!!errors.applicant?.name}
              {...register('applicant.name')}
            />
          </Field>
          <Field
            label="Contact (postal address, e-mail or telephone)"
            htmlFor="applicant-contact"
            error={errors.applicant?.contact?.message}
          >
            <input
              id="applicant-contact"
              className="input"
              autoComplete="off"
              aria-invalid={!!errors.applicant?.contact}
              {...register('applicant.contact')}
            />
          </Field>
          <Field label="Interest in the land" htmlFor="applicant-interest" error={errors.applicant?.interest?.message}>
            <select id="applicant-interest" className="input" {...register('applicant.interest')}>
              {Object.entries(INTEREST_LABELS).map(([k, l]) => (
                <option key={k} value={k}>
                  {l}
                </option>
              ))}
            </select>
          </Field>
        </section>
      </div>
      <div className="flex min-w-0 flex-col gap-3">
        <section className="panel flex flex-col gap-3" aria-labelledby="f-parcels">
          <h2 id="f-parcels">Parcels</h2>
          <ParcelSearch
            id="parcel-pick"
            label="Add a parcel by reference or field name"
            onPick={(id, h) => add({ parcelId: id, reference: h.reference, areaHa: h.areaHa })}
          />
          <PickMap picked={picked} onAdd={add} drawingFor={drawingFor} onDrawn={onDrawn} />
          {drawingFor !== null && (
            <p className="notice" role="status">
              Drawing a part of parcel {picked.find((p) => p.parcelId === drawingFor)?.reference}: click the corners
              inside the parcel, double-click to finish.{' '}
              <button type="button" className="underline" onClick={() => setDrawingFor(null)}>
                Cancel drawing
              </button>
            </p>
          )}
          {picked.length === 0 ? (
            <p className="text-sm text-muted">No parcel chosen yet.</p>
          ) : (
            <ul className="flex flex-col gap-1" aria-label="Chosen parcels">
              {picked.map((p) => (
                <li
                  key={p.parcelId}
                  className="flex flex-wrap items-center gap-2 rounded border border-line px-2 py-1 text-sm"
                >
                  <strong>{p.reference}</strong>
                  <span className="text-muted">
                    {p.areaHa !== null ? hectares(p.areaHa) : ''}
                    {p.part ? ' · part drawn' : ' · whole parcel'}
                  </span>
                  <span className="ml-auto flex gap-2">
                    {p.part ? (
                      <button
                        type="button"
                        className="underline"
                        onClick={() =>
                          sync(picked.map((x) => (x.parcelId === p.parcelId ? { ...x, part: undefined } : x)))
                        }
                      >
                        Use whole parcel
                      </button>
                    ) : (
                      <button type="button" className="underline" onClick={() => setDrawingFor(p.parcelId)}>
                        Draw a part
                      </button>
                    )}
                    <button
                      type="button"
                      className="underline"
                      aria-label={`Remove parcel ${p.reference}`}
                      onClick={() => sync(picked.filter((x) => x.parcelId !== p.parcelId))}
                    >
                      Remove
                    </button>
                  </span>
                </li>
              ))}
            </ul>
          )}
          {errors.parcels && (
            <p className="error-text" role="alert">
              {errors.parcels.message ?? errors.parcels.root?.message ?? 'Check the parcels.'}
            </p>
          )}
        </section>
        {failure && (
          <div className={failure.conflict ? 'notice notice-warn' : 'notice notice-warn'} role="alert">
            {failure.conflict ? (
              <>
                <strong>Someone else changed this proposal while you were editing it.</strong> Nothing was saved.{' '}
                <a href={`/proposals/${start?.id}/edit`}>Reload the proposal</a> to see their change, then make yours
                again.<span className="block text-sm">{failure.text}</span>
              </>
            ) : (
              <>⚠ {failure.text}</>
            )}
          </div>
        )}
        <div className="flex flex-wrap gap-2">
          <button className="btn" type="submit" disabled={formState.isSubmitting}>
            {start ? 'Save changes' : 'Save as draft'}
          </button>
          <a className="btn btn-quiet" href={start ? `/proposals/${start.id}` : '/proposals'}>
            Cancel
          </a>
        </div>
        {!start && (
          <p className="text-xs text-muted">
            A saved draft can be changed until you submit it for assessment on its page.
          </p>
        )}
      </div>
    </form>
  );
}
