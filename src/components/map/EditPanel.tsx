/** Forms for a drawn parcel or an edited boundary (planners and admins). */
import { useState } from 'react';

export type DrawValues = { reference: string; name: string; landUse: string; management: string; evidence: string };

export function DrawForm({
  ready,
  busy,
  onSave,
  onCancel,
}: {
  ready: boolean;
  busy: boolean;
  onSave: (v: DrawValues) => void;
  onCancel: () => void;
}) {
  const [v, setV] = useState<DrawValues>({
    reference: '',
    name: '',
    landUse: 'grassland',
    management: '',
    evidence: 'Drawn on the map from ',
  });
  const field = (key: keyof DrawValues, label: string, hint?: string) => (
    <div className="field">
      <label htmlFor={`draw-${key}`} className="text-sm font-medium text-muted">
        {label}
      </label>
      <input
        id={`draw-${key}`}
        className="input"
        value={v[key]}
        onChange={(e) => setV({ ...v, [key]: e.target.value })}
      />
      {hint && <p className="text-xs text-muted">{hint}</p>}
    </div>
  );
  return (
    <form className="flex flex-col gap-2" onSubmit={(e) => (e.preventDefault(), onSave(v))}>
      <h2>New parcel</h2>
      <p className="text-sm text-muted">
        {ready
          ? 'Drag the corners to adjust; they snap to neighbouring boundaries.'
          : 'Click on the map to place corners; they snap to neighbouring boundaries. Double-click to finish.'}
      </p>
      {field('reference', 'Parcel reference (required)')}
      {field('name', 'Field name')}
      {field('landUse', 'Current land use')}
      {field('management', 'Current management')}
      {field('evidence', 'Evidence', 'Where the boundary comes from: survey, aerial image, declaration …')}
      <div className="flex gap-2">
        <button className="btn" type="submit" disabled={!ready || busy || !v.reference.trim()}>
          {busy ? 'Saving…' : 'Save parcel'}
        </button>
        <button className="btn btn-quiet" type="button" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}

export function BoundaryForm({
  reference,
  busy,
  onSave,
  onCancel,
}: {
  reference: string;
  busy: boolean;
  onSave: (reason: string) => void;
  onCancel: () => void;
}) {
  const [reason, setReason] = useState('');
  return (
    <form className="flex flex-col gap-2" onSubmit={(e) => (e.preventDefault(), onSave(reason))}>
      <h2>Edit boundary of {reference}</h2>
      <p className="text-sm text-muted">
        Drag corners (they snap to neighbours); click an edge to add a corner, Alt-click a corner to remove it.
      </p>
      <div className="field">
        <label htmlFor="boundary-reason" className="text-sm font-medium text-muted">
          Why does the boundary change? (required)
        </label>
        <input id="boundary-reason" className="input" value={reason} onChange={(e) => setReason(e.target.value)} />
      </div>
      <div className="flex gap-2">
        <button className="btn" type="submit" disabled={busy || reason.trim().length < 3}>
          {busy ? 'Saving…' : 'Save boundary'}
        </button>
        <button className="btn btn-quiet" type="button" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}
