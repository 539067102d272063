import { useCallback, useEffect, useState } from 'react';
import { ROLES, ROLE_LABELS, type Role } from '~/lib/auth/roles';
import { apiFetch, ApiError } from '../ui/api-client';
import { InviteUserForm } from './InviteUserForm';

type User = { id: string; name: string; email: string; roles: Role[]; status: 'invited' | 'active' | 'deactivated' };
const STATUS_TEXT = { invited: 'Invited, no password yet', active: 'Active', deactivated: 'Deactivated' };

export function UsersAdmin({ selfId }: { selfId: string }) {
  const [users, setUsers] = useState<User[]>([]);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const load = useCallback(() => apiFetch<{ items: User[] }>('/api/users').then((d) => setUsers(d.items)), []);
  useEffect(() => void load(), [load]);

  async function act(label: string, fn: () => Promise<unknown>) {
    setNote(null);
    try {
      await fn();
      setNote({ ok: true, text: label });
      await load();
    } catch (e) {
      setNote({ ok: false, text: e instanceof ApiError ? e.message : 'That did not work.' });
    }
  }
  const toggleRole = (u: User, r: Role) => {
    const roles = u.roles.includes(r) ? u.roles.filter((x) => x !== r) : [...u.roles, r];
    return act(`Roles of ${u.name} changed.`, () => apiFetch(`/api/users/${u.id}`, { method: 'PATCH', body: { roles } }));
  };

  const roleToggles = (u: User) => (
    <div className="flex flex-wrap gap-x-3" role="group" aria-label={`Roles of ${u.name}`}>
      {ROLES.map((r) => (
        <label key={r} className="flex items-center gap-1 text-sm">
          <input type="checkbox" checked={u.roles.includes(r)} disabled={u.roles.length === 1 && u.roles[0] === r} onChange={() => void toggleRole(u, r)} />
          {ROLE_LABELS[r]}
        </label>
      ))}
    </div>
  );
  const actions = (u: User) => (
    <>
      {u.status === 'invited' && (
        <button className="btn btn-quiet" onClick={() => void act(`New invitation sent to ${u.email}.`, () => apiFetch(`/api/users/${u.id}/invitation`, { method: 'POST' }))}>
          Resend invitation
        </button>
      )}
      {u.id !== selfId && (
        <button
          className="btn btn-quiet"
          onClick={() => void act(`${u.name} ${u.status === 'deactivated' ? 'reactivated' : 'deactivated'}.`, () => apiFetch(`/api/users/${u.id}`, { method: 'PATCH', body: { active: u.status === 'deactivated' } }))}
        >
          {u.status === 'deactivated' ? 'Reactivate' : 'Deactivate'}
        </button>
      )}
    </>
  );

  return (
    <div className="flex flex-col gap-5">
      <section className="panel">
        <h2 className="mb-3">Invite someone</h2>
        <InviteUserForm onInvited={() => void load()} />
      </section>
      <section className="panel">
        <h2 className="mb-2">People with access</h2>
        {note && (
          <p role={note.ok ? 'status' : 'alert'} className={`mb-2 ${note.ok ? 'text-sward-700' : 'error-text'}`}>
            {note.text}
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
                <td>{roleToggles(u)}</td>
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
              <div className="mt-1">{roleToggles(u)}</div>
              <div className="mt-1 flex flex-wrap gap-2">{actions(u)}</div>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
