import { useId, useState } from 'react';
import { ROLES, ROLE_LABELS, type Role } from '~/lib/auth/roles';
import { lockedReason, rolesText, type AdminUser } from './role-words';

/** A person's roles as a pending change: ticks change nothing until Save; Cancel puts them back. */
export function RoleEditor({
  user,
  isSelf,
  onSave,
}: {
  user: AdminUser;
  isSelf: boolean;
  onSave: (roles: Role[]) => Promise<boolean>;
}) {
  const [pending, setPending] = useState<Role[]>(user.roles);
  const [busy, setBusy] = useState(false);
  const base = useId();
  const changed = ROLES.some((r) => pending.includes(r) !== user.roles.includes(r));
  const toggle = (r: Role) =>
    setPending((p) => (p.includes(r) ? p.filter((x) => x !== r) : ROLES.filter((x) => x === r || p.includes(x))));
  async function save() {
    setBusy(true);
    const ok = await onSave(pending);
    setBusy(false);
    if (!ok) setPending(user.roles);
  }
  return (
    <div>
      <div className="flex flex-wrap gap-x-3" role="group" aria-label={`Roles of ${user.name}`}>
        {ROLES.map((r) => {
          const reason = pending.includes(r) ? lockedReason(r, pending, isSelf) : null;
          return (
            <label key={r} className="flex items-center gap-1 text-sm">
              <input
                type="checkbox"
                checked={pending.includes(r)}
                disabled={reason !== null || busy}
                aria-describedby={reason ? `${base}-${r}` : undefined}
                onChange={() => toggle(r)}
              />
              {ROLE_LABELS[r]}
            </label>
          );
        })}
      </div>
      {ROLES.filter((r) => pending.includes(r) && lockedReason(r, pending, isSelf)).map((r) => (
        <p key={r} id={`${base}-${r}`} className="text-xs text-muted">
          {ROLE_LABELS[r]} cannot be unticked: {lockedReason(r, pending, isSelf)}
        </p>
      ))}
      {changed && (
        <div
          className="mt-1 flex flex-wrap items-center gap-2 text-sm"
          role="group"
          aria-label={`Unsaved role change for ${user.name}`}
        >
          <span>
            Not saved yet: {user.name} would have {rolesText(pending)} (now {rolesText(user.roles)}).
          </span>
          <button type="button" className="btn" disabled={busy} onClick={() => void save()}>
            Save roles of {user.name}
          </button>
          <button type="button" className="btn btn-quiet" disabled={busy} onClick={() => setPending(user.roles)}>
            Cancel
          </button>
        </div>
      )}
    </div>
  );
}
