/** "Record a land-use event" in the parcel panel (planners and admins): date, kind, value for the kind, evidence. */
import { formatDate } from '~/lib/format/dates';
import { useState } from 'react';
import { useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import type { LandUseEventKind } from '~/lib/gis/land-use-history';
import {
  checkLandUseEvent,
  EARLIEST_EVENT_DATE,
  EVENT_KIND_LABELS,
  EVENT_KINDS,
  EVENT_VALUES,
  VALUE_OPTIONAL,
} from '~/lib/gis/land-use-events';
import { apiFetch, ApiError } from '../ui/api-client';
import { Field } from '../ui/Field';

const todayUtc = () => new Date().toISOString().slice(0, 10);
const FIELDS = ['date', 'kind', 'value', 'evidence'] as const;

type EventFormValues = { date: string; kind: LandUseEventKind; value: string; evidence: string };

/** The same checks as the server (src/lib/gis/land-use-events.ts); the server checks again. No zod here: it would weigh on the map page. */
const eventResolver: Resolver<EventFormValues> = async (values) => {
  const issues = checkLandUseEvent(values, todayUtc());
  if (issues.length === 0) return { values, errors: {} };
  const errors: FieldErrors<EventFormValues> = {};
  for (const i of issues) {
    const key = i.path[0] as keyof EventFormValues;
    errors[key] ??= { type: 'custom', message: i.message };
  }
  return { values: {}, errors };
};

const EMPTY: EventFormValues = { date: '', kind: 'land-use', value: '', evidence: '' };

export function EventForm({ parcelId, onRecorded }: { parcelId: number; onRecorded: () => Promise<void> }) {
  const [done, setDone] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const { register, handleSubmit, watch, setValue, setError, reset, formState } = useForm<EventFormValues>({
    resolver: eventResolver,
    defaultValues: EMPTY,
  });
  const errors = formState.errors;
  const kind = watch('kind');
  const kindWord = EVENT_KIND_LABELS[kind].toLowerCase();

  const onSubmit = handleSubmit(async (v) => {
    setDone(null);
    setFailure(null);
    try {
      await apiFetch<{ id: number }>(`/api/parcels/${parcelId}/events`, {
        body: { date: v.date, kind: v.kind, value: v.value || undefined, evidence: v.evidence },
      });
      reset(EMPTY);
      setDone(
        `Recorded ${kindWord}${v.value ? ` (${EVENT_VALUES[v.kind][v.value]})` : ''} on ${formatDate(v.date)}. The status above is updated.`,
      );
      await onRecorded();
    } catch (e) {
      if (!(e instanceof ApiError)) return setFailure('The event could not be recorded.');
      const known = e.issues.filter((i) => (FIELDS as readonly unknown[]).includes(i.path[0]));
      known.forEach((i) => setError(i.path[0] as (typeof FIELDS)[number], { message: i.message }));
      if (known.length === 0) setFailure(e.message);
    }
  });

  const invalid = (k: keyof EventFormValues) => ({
    'aria-invalid': !!errors[k],
    'aria-describedby': errors[k] ? `event-${k}-error` : undefined,
  });
  return (
    <details className="rounded border border-line p-2">
      <summary className="cursor-pointer text-sm font-semibold">Record a land-use event</summary>
      <form onSubmit={onSubmit} noValidate className="mt-2 flex flex-col gap-2" aria-label="Record a land-use event">
        <div className="grid grid-cols-2 gap-2">
          <Field label="Date" htmlFor="event-date" error={errors.date?.message}>
            <input
              id="event-date"
              type="date"
              className="input"
              min={EARLIEST_EVENT_DATE}
              max={todayUtc()}
              {...invalid('date')}
              {...register('date')}
            />
          </Field>
          <Field label="Kind" htmlFor="event-kind" error={errors.kind?.message}>
            <select
              id="event-kind"
              className="input"
              {...invalid('kind')}
              {...register('kind', { onChange: () => setValue('value', '') })}
            >
              {EVENT_KINDS.map((k) => (
                <option key={k} value={k}>
                  {EVENT_KIND_LABELS[k]}
                </option>
              ))}
            </select>
          </Field>
        </div>
        <Field
          label={VALUE_OPTIONAL.includes(kind) ? 'Method (optional)' : EVENT_KIND_LABELS[kind]}
          htmlFor="event-value"
          error={errors.value?.message}
        >
          <select id="event-value" className="input" {...invalid('value')} {...register('value')}>
            <option value="">{VALUE_OPTIONAL.includes(kind) ? 'Not recorded' : 'Choose…'}</option>
            {Object.entries(EVENT_VALUES[kind]).map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </Field>
        <Field
          label="Evidence (required)"
          htmlFor="event-evidence"
          error={errors.evidence?.message}
          hint="Where this comes from: survey, declaration, aerial image …"
        >
          <input id="event-evidence" className="input" {...invalid('evidence')} {...register('evidence')} />
        </Field>
        <button className="btn self-start" type="submit" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Recording…' : 'Record event'}
        </button>
        {done && (
          <p role="status" className="notice text-sm">
            ✓ {done}
          </p>
        )}
        {failure && (
          <p role="alert" className="notice notice-warn text-sm">
            ⚠ {failure}
          </p>
        )}
      </form>
    </details>
  );
}
