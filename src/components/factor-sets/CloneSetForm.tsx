import { ActionForm } from './ActionForm';

type Source = { id: string; title: string; version: number };

/** Copies a published set into a new country-specific (Tier 2) draft. */
export function CloneSetForm({ sources }: { sources: Source[] }) {
  return (
    <CopySetForm
      sources={sources}
      label="Copy into a new set"
      url="/api/factor-sets"
      idLabel="New set id (lower-case, hyphens)"
      idPlaceholder="national-2027"
      reasonLabel="Why a country-specific set is needed (recorded in the audit log)"
    />
  );
}

/** Copies a published rule set into a new one. */
export function CloneRuleSetForm({ sources }: { sources: Source[] }) {
  return (
    <CopySetForm
      sources={sources}
      label="Copy into a new rule set"
      url="/api/rule-sets"
      next="rule-set"
      idLabel="New rule-set id (lower-case, hyphens)"
      idPlaceholder="tarrow-2027"
      reasonLabel="Why a new rule set is needed (recorded in the audit log)"
    />
  );
}

/** The form both copy: which published version, the new id, title, description and the reason for the audit log. */
function CopySetForm({
  sources,
  label,
  url,
  next,
  idLabel,
  idPlaceholder,
  reasonLabel,
}: {
  sources: Source[];
  label: string;
  url: string;
  next?: 'rule-set';
  idLabel: string;
  idPlaceholder: string;
  reasonLabel: string;
}) {
  const s = (f: FormData, k: string) => String(f.get(k) ?? '');
  return (
    <ActionForm
      label={label}
      url={url}
      next={next}
      className="grid gap-3 md:grid-cols-2"
      body={(f) => {
        const [id, version] = s(f, 'from').split('@');
        return {
          from: { id, version: Number(version) },
          id: s(f, 'id'),
          title: s(f, 'title'),
          description: s(f, 'description'),
          reason: s(f, 'reason'),
        };
      }}
    >
      <label className="field">
        <span>Copy from</span>
        <select name="from" className="input">
          {sources.map((x) => (
            <option key={`${x.id}@${x.version}`} value={`${x.id}@${x.version}`}>
              {x.title} v{x.version}
            </option>
          ))}
        </select>
      </label>
      <label className="field">
        <span>{idLabel}</span>
        <input name="id" className="input" placeholder={idPlaceholder} required />
      </label>
      <label className="field">
        <span>Title</span>
        <input name="title" className="input" required />
      </label>
      <label className="field">
        <span>Description</span>
        <input name="description" className="input" required />
      </label>
      <label className="field md:col-span-2">
        <span>{reasonLabel}</span>
        <textarea name="reason" className="input" rows={2} required />
      </label>
    </ActionForm>
  );
}
