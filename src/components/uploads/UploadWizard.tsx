/**
 * The upload wizard: file → columns → coordinate system → validation report → save or cancel.
 * The upload's id goes into the address (`?upload=<id>`) once the file is read; opening that
 * address again picks the upload up from what the server stored (restore.ts).
 */
import { countOf } from '~/lib/gis/issue-words';
import { useEffect, useRef, useState } from 'react';
import { apiFetch, ApiError } from '../ui/api-client';
import { CrsStep } from './CrsStep';
import { MappingStep, suggestMapping } from './MappingStep';
import { initialPhases, Progress, type PhaseKey, type PhaseState } from './Progress';
import { ReportStep } from './ReportStep';
import { CHECK_PHASES } from './progress-words';
import { phasesOf, restoredView, setUploadParam, uploadParam, useUploadStatus } from './restore';
import { SavedStep } from './SavedStep';
import { ServerProgress } from './ServerProgress';
import type { Mapping, Report, Saved, Staged, UploadStatus } from './types';
import { uploadWithProgress } from './upload-request';

type Step = 'file' | 'mapping' | 'crs' | 'report' | 'saved' | 'working';
const STEPS: { key: Step; label: string }[] = [
  { key: 'file', label: 'File' },
  { key: 'mapping', label: 'Columns' },
  { key: 'crs', label: 'Coordinates' },
  { key: 'report', label: 'Check' },
  { key: 'saved', label: 'Saved' },
];

const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

export function UploadWizard({ purpose }: { purpose: 'parcels' | 'reference' }) {
  const [step, setStep] = useState<Step>('file');
  const [phases, setPhases] = useState(initialPhases);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [staged, setStaged] = useState<Staged | null>(null);
  const [layerName, setLayerName] = useState('');
  const [mapping, setMapping] = useState<Mapping>({});
  const [epsg, setEpsg] = useState<number | null>(null);
  const [report, setReport] = useState<Report | null>(null);
  const [saved, setSaved] = useState<Saved | null>(null);
  const [watchId, setWatchId] = useState<string | null>(null);
  const [known, setKnown] = useState<UploadStatus | null>(null);
  const [lastRun, setLastRun] = useState<PhaseKey | null>(null);
  const [round, setRound] = useState(0);
  const [restoring, setRestoring] = useState(false);
  const lostAnswer = useRef(false);
  const fileRef = useRef<HTMLInputElement>(null);
  const heading = useRef<HTMLHeadingElement>(null);
  const layer = staged?.layers.find((l) => l.name === layerName) ?? null;
  const phase = (k: PhaseKey, p: PhaseState) => setPhases((all) => ({ ...all, [k]: p }));
  const go = (s: Step) => (setStep(s), setError(null), setTimeout(() => heading.current?.focus(), 0));
  // The stored progress: watched after a reload while the server works, polled while this page checks or saves.
  const pollId = watchId ?? (busy && (step === 'crs' || step === 'report') ? (staged?.id ?? null) : null);
  const live = useUploadStatus(pollId, pollId !== null, round);
  const latest = live?.id === pollId ? live : known;
  const working = pollId !== null && latest?.id === pollId && latest.state === 'running' ? latest : null;

  function apply(s: UploadStatus) {
    const v = restoredView(s);
    setKnown(s);
    setPhases(phasesOf(s));
    setStaged(s.staged);
    if (s.staged) {
      const l = s.staged.layers.find((x) => x.name === v.layerName) ?? s.staged.layers[0]!;
      setLayerName(l.name);
      setMapping(v.mapping ?? suggestMapping(purpose, l));
      setEpsg(v.epsg);
    }
    setReport(s.report);
    setSaved(s.saved);
    setWatchId(v.step === 'working' ? s.id : null);
    if (v.step === 'file') setUploadParam(null);
    go(v.step);
    setError(v.error);
  }

  useEffect(() => {
    const id = uploadParam();
    if (!id) return;
    setRestoring(true);
    apiFetch<UploadStatus>(`/api/uploads/${id}`)
      .then(apply)
      .catch((e) => {
        setUploadParam(null);
        setError(e instanceof ApiError ? e.message : 'That upload could not be opened; try again.');
      })
      .finally(() => setRestoring(false));
    // Once, on load: the address names the upload to pick up.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  useEffect(() => {
    if (!watchId || live?.id !== watchId || live.state === 'running') return;
    apply(live);
    // A request whose answer was lost and that left the upload as it was never reached the server.
    if (lostAnswer.current && live.state === 'staged') setError('The server did not receive that request; try again.');
    lostAnswer.current = false;
    // apply only when the watched work has ended
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [live, watchId]);

  async function run<T>(k: PhaseKey, fn: () => Promise<T>): Promise<T | null> {
    setBusy(true);
    setError(null);
    setLastRun(k);
    setRound((r) => r + 1);
    const t0 = performance.now();
    phase(k, { state: 'running' });
    try {
      const r = await fn();
      phase(k, { state: 'done', detail: seconds(performance.now() - t0) });
      return r;
    } catch (e) {
      // The answer was lost on the way (network, proxy), not refused: the server may still be at it, so follow its stored progress.
      if (staged && (!(e instanceof ApiError) || e.status === 0 || e.status >= 502)) {
        lostAnswer.current = true;
        setRound((r) => r + 1);
        setWatchId(staged.id);
        go('working');
        return null;
      }
      phase(k, { state: 'failed' });
      setError(e instanceof ApiError ? e.message : 'That did not work; try again.');
      return null;
    } finally {
      setBusy(false);
    }
  }

  async function upload() {
    const file = fileRef.current?.files?.[0];
    if (!file) return setError('Choose a zipped shapefile (.zip) or a GeoJSON file first.');
    setPhases(initialPhases());
    const form = new FormData();
    form.set('purpose', purpose);
    form.set('file', file);
    setBusy(true);
    setError(null);
    const t0 = performance.now();
    let sentAt = 0;
    phase('upload', { state: 'running', detail: '0 %' });
    let r: Staged;
    try {
      r = await uploadWithProgress<Staged>(
        '/api/uploads',
        form,
        (f) => phase('upload', { state: 'running', detail: `${Math.round(f * 100)} %` }),
        () => (
          (sentAt = performance.now()),
          phase('upload', { state: 'done', detail: seconds(sentAt - t0) }),
          phase('parse', { state: 'running' })
        ),
      );
      phase('parse', { state: 'done', detail: seconds(performance.now() - (sentAt || t0)) });
    } catch (e) {
      setPhases((p) => ({ ...p, ...(sentAt ? { parse: { state: 'failed' } } : { upload: { state: 'failed' } }) }));
      setError(e instanceof ApiError ? e.message : 'The upload failed; try again.');
      return;
    } finally {
      setBusy(false);
    }
    setStaged(r);
    setUploadParam(r.id);
    setLayerName(r.layers[0]!.name);
    setMapping(suggestMapping(purpose, r.layers[0]!));
    setEpsg(null);
    go('mapping');
  }

  async function validate() {
    if (!staged || !layer) return;
    if (!layer.crs && epsg === null) return setError('Choose the coordinate reference system first.');
    const body = {
      layer: layer.name,
      mapping: Object.fromEntries(Object.entries(mapping).filter(([, v]) => v)),
      ...(epsg !== null ? { epsg } : {}),
    };
    const r = await run('validate', () => apiFetch<Report>(`/api/uploads/${staged.id}/validation`, { body }));
    if (r) {
      setReport(r);
      go('report');
    }
  }

  async function save() {
    if (!staged) return;
    const r = await run('save', () => apiFetch<Saved>(`/api/uploads/${staged.id}/save`, { method: 'POST' }));
    if (r) {
      setSaved(r);
      go('saved');
    }
  }

  async function cancel() {
    if (staged) await apiFetch(`/api/uploads/${staged.id}`, { method: 'DELETE' }).catch(() => undefined);
    setStaged(null);
    setReport(null);
    setUploadParam(null);
    setPhases(initialPhases());
    if (fileRef.current) fileRef.current.value = '';
    go('file');
  }

  const mappingReady = purpose === 'reference' ? !!mapping.kind && !!mapping.classAttribute : !!mapping.reference;
  const noun = purpose === 'parcels' ? 'parcels' : 'features';
  const checking = working ? CHECK_PHASES.includes(working.phase) : lastRun === 'validate';
  const current = step === 'working' ? (checking ? 'report' : 'saved') : step;
  const title =
    step === 'working' ? (checking ? 'Checking every feature' : 'Saving') : STEPS.find((s) => s.key === step)!.label;
  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Steps">
        <ol className="flex flex-wrap gap-2 text-sm">
          {STEPS.map((s, i) => (
            <li
              key={s.key}
              aria-current={s.key === current ? 'step' : undefined}
              className={s.key === current ? 'rounded bg-sward-700 px-2 py-0.5 text-white' : 'px-2 py-0.5 text-muted'}
            >
              {i + 1}. {s.label}
            </li>
          ))}
        </ol>
      </nav>
      <Progress phases={phases} />
      <section className="panel flex flex-col gap-4" aria-labelledby="step-heading">
        <h2 id="step-heading" ref={heading} tabIndex={-1}>
          {title}
        </h2>
        {restoring && <p role="status">Opening the upload…</p>}
        {working && <ServerProgress status={working} />}
        {step === 'working' && !working && <p role="status">Asking the server how far the work has got…</p>}
        {error && (
          <p className="notice notice-warn" role="alert">
            <span aria-hidden="true">⚠ </span>
            {error}
          </p>
        )}
        {step === 'file' && (
          <div className="flex flex-col gap-3">
            <div className="field">
              <label htmlFor="upload-file" className="text-sm font-medium text-muted">
                Zipped shapefile (.zip with .shp, .shx, .dbf and ideally .prj, .cpg) or GeoJSON (.geojson)
              </label>
              <input
                id="upload-file"
                ref={fileRef}
                type="file"
                accept=".zip,.geojson,.json,application/zip,application/geo+json"
                className="input"
              />
            </div>
            <button className="btn self-start" onClick={() => void upload()} disabled={busy}>
              {busy ? 'Reading…' : 'Upload and read'}
            </button>
          </div>
        )}
        {step === 'mapping' && staged && layer && (
          <>
            <p className="text-sm">
              “{staged.fileName}”: {staged.layers.length} layer(s), {layer.featureCount} features in “{layer.name}” (
              {layer.geometryType}).
            </p>
            {staged.layers.length > 1 && (
              <div className="field max-w-md">
                <label htmlFor="layer" className="text-sm font-medium text-muted">
                  Layer to import
                </label>
                <select
                  id="layer"
                  className="input"
                  value={layerName}
                  onChange={(e) => (
                    setLayerName(e.target.value),
                    setMapping(
                      suggestMapping(
                        purpose,
                        staged.layers.find((l) => l.name === e.target.value)!,
                      ),
                    )
                  )}
                >
                  {staged.layers.map((l) => (
                    <option key={l.name} value={l.name}>
                      {l.name} ({l.featureCount})
                    </option>
                  ))}
                </select>
              </div>
            )}
            {layer.rememberedMapping && (
              <p className="notice text-sm">The columns are filled in as last time for a file with these columns.</p>
            )}
            <MappingStep purpose={purpose} layer={layer} mapping={mapping} onChange={setMapping} />
            <div className="flex flex-wrap gap-2">
              <button className="btn" onClick={() => go('crs')} disabled={!mappingReady}>
                Next: coordinates
              </button>
              <button className="btn btn-quiet" onClick={() => void cancel()}>
                Cancel upload
              </button>
            </div>
          </>
        )}
        {step === 'crs' && layer && (
          <>
            <CrsStep layer={layer} epsg={epsg} onChange={setEpsg} />
            <div className="flex flex-wrap gap-2">
              <button className="btn" onClick={() => void validate()} disabled={busy || (!layer.crs && epsg === null)}>
                {busy ? 'Checking…' : 'Check every feature'}
              </button>
              <button className="btn btn-quiet" onClick={() => go('mapping')}>
                Back to columns
              </button>
              <button className="btn btn-quiet" onClick={() => void cancel()}>
                Cancel upload
              </button>
            </div>
          </>
        )}
        {step === 'report' && report && (
          <>
            <ReportStep report={report} purpose={purpose} uploadId={report.id} />
            <div className="flex flex-wrap gap-2">
              <button
                className="btn"
                onClick={() => void save()}
                disabled={busy || report.summary.total === report.summary.rejected}
              >
                {busy
                  ? 'Saving…'
                  : `Save ${countOf(report.summary.total - report.summary.rejected, `valid ${noun.replace(/s$/, '')}`, `valid ${noun}`)}`}
              </button>
              <button className="btn btn-quiet" onClick={() => go('mapping')}>
                Back to columns
              </button>
              <button className="btn btn-quiet" onClick={() => void cancel()}>
                Cancel upload
              </button>
            </div>
          </>
        )}
        {step === 'saved' && saved && (
          <SavedStep
            saved={saved}
            noun={noun}
            onAgain={() => (setPhases(initialPhases()), setStaged(null), setUploadParam(null), go('file'))}
          />
        )}
      </section>
    </div>
  );
}
