import { ActionForm } from './ActionForm';

/** Copies a published set into a new country-specific (Tier 2) draft. */
export function CloneSetForm({ sources }: { sources: { id: string; title: string; version: number }[] }) {
  const s = (f: FormData, k: string) => String(f.get(k) ?? '');
  return (
    <ActionForm
      label="Copy into a new set"
      url="/api/factor-sets"
      className="grid gap-3 md:grid-cols-2"
      body={(f) => {
        const [id, version] = s(f, 'from').split('@');
        return { from: { id, version: Number(version) }, id: s(f, 'id'), title: s(f, 'title'), description: s(f, 'description'), reason: s(f, 'reason') };
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
        <span>New set id (lower-case, hyphens)</span>
        <input name="id" className="input" placeholder="national-2027" required />
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
        <span>Why a country-specific set is needed (recorded in the audit log)</span>
        <textarea name="reason" className="input" rows={2} required />
      </label>
    </ActionForm>
  );
}
