import { useState, type FormEvent } from 'react';
import type { NewShareLink, ShareLinkView } from '@shared/schemas/handoff';
import { SHARE_LINK_DEFAULT_DAYS, SHARE_LINK_MAX_DAYS } from '@shared/schemas/handoff';
import { Button } from '@/components/button';
import { ErrorNote } from '@/components/query-state';
import { TextField } from '@/components/text-field';
import { ApiError } from '@/lib/api-client';
import { count } from '@/lib/units';
import { useCreateShareLink } from '../api/create-share-link';
import { useRevokeShareLink } from '../api/revoke-share-link';
import { timeLeft, when } from '../lib/format';

interface Props {
  studioId: string;
  stackId: string;
  links: ShareLinkView[];
  canManage: boolean;
  onCreated: (link: NewShareLink) => void;
}

const STATUS_LABEL = { active: 'Active', expired: 'Expired', revoked: 'Revoked' } as const;

/** Every share link of the stack: expiry, downloads, and revoking; a new one for a lost link. */
export function ShareLinkList({ studioId, stackId, links, canManage, onCreated }: Props) {
  const revoke = useRevokeShareLink(studioId, stackId);
  const create = useCreateShareLink(studioId, stackId);
  const [expiryDays, setExpiryDays] = useState(String(SHARE_LINK_DEFAULT_DAYS));
  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate(Number(expiryDays), { onSuccess: (r) => onCreated(r.shareLink) });
  };
  return (
    <div className="space-y-2">
      <h3 className="text-sm font-semibold">Share links</h3>
      {links.length === 0 ? <p className="text-sm text-slate">No share links.</p> : (
        <div className="overflow-x-auto">
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Share links of this stack</caption>
            <thead className="text-slate">
              <tr><th className="py-1 pr-2 font-medium">For</th><th className="pr-2 font-medium">Expires</th><th className="pr-2 text-right font-medium">Downloads</th><th className="pr-2 font-medium">State</th><th><span className="sr-only">Actions</span></th></tr>
            </thead>
            <tbody>
              {links.map((l) => (
                <tr key={l.id} className="border-t border-rule">
                  <td className="py-1 pr-2">{l.email}<div className="text-xs text-slate">made {when(l.createdAt)}</div></td>
                  <td className="num pr-2">{when(l.expiresAt)}{l.status === 'active' ? <div className="text-xs text-slate">{timeLeft(l.expiresAt)}</div> : null}</td>
                  <td className="num pr-2 text-right">{count(l.downloadCount)}{l.lastDownloadAt ? <div className="text-xs text-slate">last {when(l.lastDownloadAt)}</div> : null}</td>
                  <td className={`pr-2 ${l.status === 'active' ? 'text-moss' : 'text-slate'}`}>{STATUS_LABEL[l.status]}</td>
                  <td className="text-right">
                    {canManage && l.status === 'active' ? (
                      <Button variant="quiet" disabled={revoke.isPending} onClick={() => revoke.mutate(l.id)} aria-label={`Revoke the share link for ${l.email} made ${when(l.createdAt)}`}>Revoke</Button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {revoke.error ? <ErrorNote error={revoke.error} /> : null}
      {canManage ? (
        <form onSubmit={submit} className="flex flex-wrap items-end gap-2" noValidate>
          <TextField
            label="New link valid for" unit="days" type="number" inputMode="numeric" min={1} max={SHARE_LINK_MAX_DAYS} step={1} className="w-40"
            value={expiryDays} onChange={(e) => setExpiryDays(e.target.value)}
            error={create.error instanceof ApiError ? create.error.fieldError('expiryDays') : undefined}
          />
          <Button type="submit" variant="secondary" disabled={create.isPending}>Make a new link</Button>
        </form>
      ) : null}
      {create.error && !(create.error instanceof ApiError && create.error.details?.length) ? <ErrorNote error={create.error} /> : null}
    </div>
  );
}
