/** For assessors on a draft: findings (saved with the row version), sign-off, and re-running with overrides. */
import { useState } from 'react';
import { GWP_SETS, type LandUseState } from '~/lib/carbon/types';
import { GWP_LABELS } from '../calculator/labels';
import { ParcelSearch } from '../map/ParcelSearch';
import { DEFAULT_GRASSLAND, UseFields } from '../proposals/UseFields';
import { ApiError, apiFetch } from '../ui/api-client';

type SetOption = { id: string; title: string; version: number; isDefault: boolean };
type Props = {
  assessmentId: number;
  proposalId: number;
  version: number;
  findings: string;
  blocking: string[];
  parcels: { parcelId: number; reference: string }[];
  sets: SetOption[];
  factorSet: { id: string; version: number };
  gwp: string;
};

const message = (e: unknown, fallback: string) =>
  e instanceof ApiError
    ? e.status === 409 && /someone else/i.test(e.message)
      ? `Someone else changed this assessment while you had it open. ${e.message}`
      : e.message
    : fallback;

export function AssessorTools(props: Props) {
  const [version, setVersion] = useState(props.version);
  const [findings, setFindings] = useState(props.findings);
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);

  async function save() {
    setBusy(true);
    setNote(null);
    try {
      const r = await apiFetch<{ version: number }>(`/api/assessments/${props.assessmentId}`, {
        method: 'PATCH',
        body: { findings, version },
      });
      setVersion(r.version);
      setNote({ ok: true, text: 'Findings saved.' });
    } catch (e) {
      setNote({ ok: false, text: message(e, 'The findings could not be saved.') });
    } finally {
      setBusy(false);
    }
  }

  async function signOff() {
    setBusy(true);
    setNote(null);
    try {
      await apiFetch(`/api/assessments/${props.assessmentId}/sign-off`, { body: { findings, version } });
      window.location.reload();
    } catch (e) {
      setNote({ ok: false, text: message(e, 'The assessment could not be signed off.') });
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-3">
      <div className="field">
        <label htmlFor="findings" className="text-sm font-medium text-muted">
          Findings (what the board reads with the figures)
        </label>
        <textarea
          id="findings"
          className="input"
          rows={6}
          value={findings}
          onChange={(e) => setFindings(e.target.value)}
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn btn-quiet" disabled={busy} onClick={() => void save()}>
          Save findings
        </button>
        <button
          type="button"
          className="btn"
          disabled={busy || props.blocking.length > 0}
          onClick={() => void signOff()}
        >
          Sign off assessment
        </button>
      </div>
      {props.blocking.length > 0 && (
        <p className="text-sm text-muted">Sign-off is not possible until the problems listed above are resolved.</p>
      )}
      {note && (
        <p className={note.ok ? 'notice' : 'notice notice-warn'} role={note.ok ? 'status' : 'alert'}>
          {note.ok ? '✓ ' : '⚠ '}
          {note.text}
        </p>
      )}
      <RerunForm {...props} version={version} />
    </div>
  );
}

function RerunForm({ proposalId, version, parcels, sets, factorSet, gwp: currentGwp }: Props) {
  const [setKey, setSetKey] = useState(`${factorSet.id}@${factorSet.version}`);
  const [gwp, setGwp] = useState(currentGwp);
  const [overrideReason, setOverrideReason] = useState('');
  const [parcelId, setParcelId] = useState<number | ''>('');
  const [state, setState] = useState<LandUseState>(DEFAULT_GRASSLAND);
  const [stateReason, setStateReason] = useState('');
  const [share, setShare] = useState(50);
  const [compensation, setCompensation] = useState<{ id: number; label: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function run(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    const [setId, setVersion] = setKey.split('@');
    const changedSet = setKey !== `${factorSet.id}@${factorSet.version}`;
    try {
      const body = {
        version,
        ...(changedSet ? { factorSet: setId, factorSetVersion: Number(setVersion) } : {}),
        ...(gwp !== currentGwp ? { gwp } : {}),
        ...(overrideReason.trim() ? { overrideReason: overrideReason.trim() } : {}),
        ...(parcelId ? { currentStates: [{ parcelId, state, reason: stateReason }] } : {}),
        sharePercent: share,
        ...(compensation ? { compensationParcelId: compensation.id } : {}),
      };
      const a = await apiFetch<{ id: number }>(`/api/proposals/${proposalId}/assessment`, { body });
      window.location.href = `/assessments/${a.id}`;
    } catch (err) {
      setError(message(err, 'The assessment could not be re-run.'));
      setBusy(false);
    }
  }

  return (
    <details className="rounded border border-line p-3">
      <summary className="cursor-pointer font-medium">Re-run with other choices</summary>
      <form className="mt-3 flex flex-col gap-3" onSubmit={(e) => void run(e)}>
        <div className="grid gap-3 sm:grid-cols-2">
          <div className="field">
            <label htmlFor="rerun-set" className="text-sm font-medium text-muted">
              Factor set
            </label>
            <select id="rerun-set" className="input" value={setKey} onChange={(e) => setSetKey(e.target.value)}>
              {sets.map((s) => (
                <option key={`${s.id}@${s.version}`} value={`${s.id}@${s.version}`}>
                  {s.title}, version {s.version}
                  {s.isDefault ? ' (authority default)' : ''}
                </option>
              ))}
            </select>
          </div>
          <div className="field">
            <label htmlFor="rerun-gwp" className="text-sm font-medium text-muted">
              Global warming potentials
            </label>
            <select id="rerun-gwp" className="input" value={gwp} onChange={(e) => setGwp(e.target.value)}>
              {GWP_SETS.map((g) => (
                <option key={g} value={g}>
                  {GWP_LABELS[g]}
                </option>
              ))}
            </select>
          </div>
        </div>
        <div className="field">
          <label htmlFor="rerun-override-reason" className="text-sm font-medium text-muted">
            Reason for another factor set or GWP than the authority’s default (required then)
          </label>
          <input
            id="rerun-override-reason"
            className="input"
            value={overrideReason}
            onChange={(e) => setOverrideReason(e.target.value)}
          />
        </div>
        <div className="field">
          <label htmlFor="rerun-parcel" className="text-sm font-medium text-muted">
            Set the current state of a parcel (when its record does not say, or is wrong)
          </label>
          <select
            id="rerun-parcel"
            className="input"
            value={parcelId}
            onChange={(e) => setParcelId(e.target.value ? Number(e.target.value) : '')}
          >
            <option value="">Keep the states as they are</option>
            {parcels.map((p) => (
              <option key={p.parcelId} value={p.parcelId}>
                {p.reference}
              </option>
            ))}
          </select>
        </div>
        {parcelId !== '' && (
          <>
            <UseFields id="rerun-state" legend="Current state of the parcel" value={state} onChange={setState} />
            <div className="field">
              <label htmlFor="rerun-state-reason" className="text-sm font-medium text-muted">
                Reason for this state (e.g. site visit on a date)
              </label>
              <input
                id="rerun-state-reason"
                className="input"
                value={stateReason}
                onChange={(e) => setStateReason(e.target.value)}
                required
                minLength={3}
              />
            </div>
          </>
        )}
        <div className="field max-w-xs">
          <label htmlFor="rerun-share" className="text-sm font-medium text-muted">
            Share of the area for the “convert only part” alternative, %
          </label>
          <input
            id="rerun-share"
            className="input"
            type="number"
            min={1}
            max={99}
            value={share}
            onChange={(e) => setShare(Number(e.target.value))}
          />
        </div>
        <div className="flex flex-col gap-1">
          <ParcelSearch
            id="rerun-compensation"
            label="Compensation parcel (optional): a cropland parcel to restore to grassland"
            onPick={(id, h) => setCompensation({ id, label: h.reference })}
          />
          <p className="text-sm">
            {compensation ? (
              <>
                Compensation: restore parcel {compensation.label} to grassland.{' '}
                <button type="button" className="underline" onClick={() => setCompensation(null)}>
                  Remove
                </button>
              </>
            ) : (
              'None chosen.'
            )}
          </p>
        </div>
        <button className="btn self-start" type="submit" disabled={busy}>
          {busy ? 'Running…' : 'Re-run the assessment'}
        </button>
        {error && (
          <p className="notice notice-warn" role="alert">
            ⚠ {error}
          </p>
        )}
      </form>
    </details>
  );
}
