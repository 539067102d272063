import { ActionForm } from './ActionForm';
import { entryWords } from '~/lib/carbon/entry-words';

type Props = {
  setId: string;
  version: number;
  status: 'draft' | 'published';
  tableKey: string;
  confirmed: boolean;
  entries: { key: string; value: number | null }[];
};

/** Admin actions on one table: confirm it against the publication, or change a value in a draft. */
export function TableAdmin({ setId, version, status, tableKey, confirmed, entries }: Props) {
  const s = (f: FormData, k: string) => String(f.get(k) ?? '');
  if (status === 'published') {
    if (confirmed) return null;
    return (
      <details className="mt-2 text-sm">
        <summary className="cursor-pointer text-sward-700">
          Record that you checked this table against the published document
        </summary>
        <ActionForm
          label="Record the check"
          url={`/api/factor-sets/${setId}/versions/${version}/confirmations`}
          className="mt-2 grid gap-2 md:grid-cols-[2fr_1fr_auto] md:items-end"
          body={(f) => ({ tableKey, document: s(f, 'document'), page: s(f, 'page') })}
        >
          <label className="field">
            <span>Document read (title, edition)</span>
            <input name="document" className="input" required />
          </label>
          <label className="field">
            <span>Page</span>
            <input name="page" className="input" required />
          </label>
        </ActionForm>
      </details>
    );
  }
  const editable = entries.filter((e) => e.value !== null);
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer text-sward-700">Change a value in this draft</summary>
      <ActionForm
        label="Save the change"
        method="PATCH"
        url={`/api/factor-sets/${setId}/draft`}
        className="mt-2 grid gap-2 md:grid-cols-3"
        body={(f) => ({ tableKey, entryKey: s(f, 'entry'), value: Number(s(f, 'value')), reason: s(f, 'reason') })}
      >
        <label className="field">
          <span>Entry</span>
          <select name="entry" className="input">
            {editable.map((e) => (
              <option key={e.key} value={e.key}>
                {entryWords(e.key)} (now {e.value})
              </option>
            ))}
          </select>
        </label>
        <label className="field">
          <span>New value</span>
          <input name="value" type="number" step="any" min="0" className="input" required />
        </label>
        <label className="field md:col-span-3">
          <span>Reason and source of the new value (required)</span>
          <textarea name="reason" className="input" rows={2} required />
        </label>
      </ActionForm>
    </details>
  );
}
