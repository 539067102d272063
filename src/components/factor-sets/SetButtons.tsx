import { ActionForm } from './ActionForm';

/** One-click admin actions on a whole set (islands cannot take functions as props, so each is its own component). */
export function MakeDefaultButton({ setId }: { setId: string }) {
  return (
    <ActionForm
      quiet
      label="Make this the default set"
      method="PUT"
      url="/api/settings/default-factor-set"
      body={() => ({ id: setId })}
    />
  );
}

export function StartDraftButton({ setId }: { setId: string }) {
  return <ActionForm quiet label="Start a new draft from this version" url={`/api/factor-sets/${setId}/draft`} />;
}

export function PublishDraftForm({ setId }: { setId: string }) {
  return (
    <ActionForm
      label="Publish this draft"
      url={`/api/factor-sets/${setId}/publish`}
      body={(f) => ({ note: String(f.get('note') ?? '') })}
    >
      <label className="field">
        <span>What this version changes (kept with the version)</span>
        <textarea name="note" className="input" rows={2} required />
      </label>
    </ActionForm>
  );
}
