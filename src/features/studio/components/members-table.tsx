import { ROLES, ROLE_LABELS, type Role } from '@shared/roles';
import { ErrorNote } from '@/components/query-state';
import { useUpdateMember } from '../api/update-member';
import { useRemoveMember } from '../api/remove-member';
import type { Member } from '../api/get-members';

export function MembersTable({ studioId, members, isOwner, myUserId }: { studioId: string; members: Member[]; isOwner: boolean; myUserId: string }) {
  const update = useUpdateMember(studioId);
  const remove = useRemoveMember(studioId);
  return (
    <>
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Studio members</caption>
        <thead>
          <tr className="border-b border-rule text-left text-slate">
            <th scope="col" className="py-2 pr-4 font-medium">Name</th>
            <th scope="col" className="py-2 pr-4 font-medium">E-mail</th>
            <th scope="col" className="py-2 pr-4 font-medium">Role</th>
            <th scope="col" className="py-2 pr-4 font-medium">Member since</th>
            {isOwner ? <th scope="col" className="py-2 font-medium"><span className="sr-only">Actions</span></th> : null}
          </tr>
        </thead>
        <tbody>
          {members.map((m) => (
            <tr key={m.id} className="border-b border-rule/60">
              <td className="py-2 pr-4">{m.name}{m.userId === myUserId ? <span className="ml-1 text-slate">(you)</span> : null}</td>
              <td className="py-2 pr-4">{m.email}</td>
              <td className="py-2 pr-4">
                {isOwner ? (
                  <select
                    aria-label={`Role of ${m.name}`}
                    value={m.role}
                    onChange={(e) => update.mutate({ memberId: m.id, role: e.target.value as Role })}
                    className="rounded border border-rule bg-card px-2 py-1"
                  >
                    {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                  </select>
                ) : (
                  ROLE_LABELS[m.role]
                )}
              </td>
              <td className="py-2 pr-4 num">{new Date(m.since).toLocaleDateString()}</td>
              {isOwner ? (
                <td className="py-2 text-right">
                  <button type="button" className="text-clay hover:underline" aria-label={`Remove ${m.name} from the studio`} onClick={() => { if (window.confirm(`Remove ${m.name} from the studio?`)) remove.mutate(m.id); }}>
                    Remove
                  </button>
                </td>
              ) : null}
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-2"><ErrorNote error={update.error ?? remove.error} /></div>
    </>
  );
}
