import { ActionForm } from '../factor-sets/ActionForm';

/** One-click admin actions on a rule set (each its own island: islands cannot take functions as props). */
export function MakeDefaultRuleSetButton({ setId }: { setId: string }) {
  return (
    <ActionForm
      quiet
      label="Grade new assessments with this set"
      method="PUT"
      url="/api/settings/default-rule-set"
      body={() => ({ id: setId })}
      next="reload"
    />
  );
}

export function StartRuleDraftButton({ setId }: { setId: string }) {
  return (
    <ActionForm quiet label="Start a new draft from this version" url={`/api/rule-sets/${setId}/draft`} next="reload" />
  );
}

export function PublishRuleDraftForm({ setId, revision }: { setId: string; revision: number }) {
  return (
    <ActionForm
      label="Publish this draft"
      url={`/api/rule-sets/${setId}/publish`}
      body={(f) => ({ note: String(f.get('note') ?? ''), revision })}
      next="reload"
    >
      <label className="field">
        <span>What this version changes (kept with the version; a published version never changes again)</span>
        <textarea name="note" className="input" rows={2} required />
      </label>
    </ActionForm>
  );
}

export function ReferenceRatioForm({ regionKey, label, year }: { regionKey: string; label: string; year: number }) {
  const s = (f: FormData, k: string) => String(f.get(k) ?? '');
  return (
    <ActionForm
      quiet
      label={`Record the reference ratio of ${label}`}
      url={`/api/regions/${regionKey}/reference-ratio`}
      next="reload"
      className="grid gap-2 sm:grid-cols-[8rem_8rem_1fr]"
      body={(f) => ({ referenceYear: Number(s(f, 'year')), ratio: Number(s(f, 'ratio')), source: s(f, 'source') })}
    >
      <label className="field">
        <span>Reference year</span>
        <input name="year" type="number" className="input" defaultValue={year} min={1990} max={2100} required />
      </label>
      <label className="field">
        <span>Ratio (0-1)</span>
        <input name="ratio" type="number" className="input" step="0.0001" min={0} max={1} required />
      </label>
      <label className="field">
        <span>Source (document, table, date)</span>
        <input name="source" className="input" required />
      </label>
    </ActionForm>
  );
}
