import { useCallback, useEffect, useState } from 'react';
import { ROLES, type Role } from '~/lib/auth/roles';
import { apiFetch, ApiError } from '../ui/api-client';
import { InviteUserForm } from './InviteUserForm';
import { RoleEditor } from './RoleEditor';
import { rolesText, type AdminUser as User } from './role-words';

const STATUS_TEXT = { invited: 'Invited, no password yet', active: 'Active', deactivated: 'Deactivated' };

type Note = { ok: boolean; text: string; undo?: { user: User; roles: Role[] } };

export function UsersAdmin({ selfId }: { selfId: string }) {
  const [users, setUsers] = useState<User[]>([]);
  const [note, setNote] = useState<Note | null>(null);
  const load = useCallback(() => apiFetch<{ items: User[] }>('/api/users').then((d) => setUsers(d.items)), []);
  useEffect(() => void load(), [load]);

  async function act(label: string, fn: () => Promise<unknown>, undo?: Note['undo']) {
    setNote(null);
    try {
      await fn();
      setNote({ ok: true, text: label, undo });
      await load();
      return true;
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'That did not work.' });
      if (e instanceof ApiError && e.status === 409) await load();
      return false;
    }
  }
  const patch = (u: User, body: Record<string, unknown>) =>
    apiFetch<User>(`/api/users/${u.id}`, { method: 'PATCH', body: { version: u.version, ...body } });

  const saveRoles = (u: User, roles: Role[]) =>
    act(`Roles of ${u.name} changed from ${rolesText(u.roles)} to ${rolesText(roles)}.`, () => patch(u, { roles }), {
      user: u,
      roles: u.roles,
    });
  async function undo(n: NonNullable<Note['undo']>) {
    const now = users.find((x) => x.id === n.user.id);
    if (!now) return;
    await act(`Undone: ${now.name} has ${rolesText(n.roles)} again.`, () => patch(now, { roles: n.roles }));
  }

  const actions = (u: User) => (
    <>
      {u.status === 'invited' && (
        <button
          className="btn btn-quiet"
          onClick={() =>
            void act(`New invitation sent to ${u.email}.`, () =>
              apiFetch(`/api/users/${u.id}/invitation`, { method: 'POST' }),
            )
          }
        >
          Resend invitation
        </button>
      )}
      {u.id !== selfId && (
        <button
          className="btn btn-quiet"
          onClick={() => {
            const off = u.status !== 'deactivated';
            if (
              off &&
              !window.confirm(`Deactivate ${u.name}? They are signed out at once and cannot sign in until reactivated.`)
            )
              return;
            void act(`${u.name} ${off ? 'deactivated' : 'reactivated'}.`, () => patch(u, { active: !off }));
          }}
        >
          {u.status === 'deactivated' ? 'Reactivate' : 'Deactivate'}
        </button>
      )}
    </>
  );
  const editor = (u: User) => (
    <RoleEditor
      key={`${u.id}:${u.version}`}
      user={u}
      isSelf={u.id === selfId}
      onSave={(roles) => saveRoles(u, roles)}
    />
  );

  return (
    <div className="flex flex-col gap-5">
      <section className="panel">
        <h2 className="mb-3">Invite someone</h2>
        <InviteUserForm onInvited={() => void load()} />
      </section>
      <section className="panel">
        <h2 className="mb-2">People with access</h2>
        <p className="mb-2 text-sm text-muted">
          Tick or untick roles, then save; nothing changes until you do. Roles: {ROLES.length} kinds, at least one per
          person.
        </p>
        {note && (
          <p role={note.ok ? 'status' : 'alert'} className={`mb-2 ${note.ok ? 'text-sward-700' : 'error-text'}`}>
            {note.text}{' '}
            {note.undo && (
              <button type="button" className="btn btn-quiet" onClick={() => void undo(note.undo!)}>
                Undo
              </button>
            )}
          </p>
        )}
        <table className="data-table hidden md:table">
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">E-mail</th>
              <th scope="col">Roles</th>
              <th scope="col">Status</th>
              <th scope="col">Actions</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.id}>
                <td>{u.name}</td>
                <td>{u.email}</td>
                <td>{editor(u)}</td>
                <td>{STATUS_TEXT[u.status]}</td>
                <td className="whitespace-nowrap">{actions(u)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <ul className="flex flex-col divide-y divide-line md:hidden">
          {users.map((u) => (
            <li key={u.id} className="py-3">
              <p className="font-semibold">{u.name}</p>
              <p className="break-all text-sm">{u.email}</p>
              <p className="text-sm text-muted">{STATUS_TEXT[u.status]}</p>
              <div className="mt-1">{editor(u)}</div>
              <div className="mt-1 flex flex-wrap gap-2">{actions(u)}</div>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
