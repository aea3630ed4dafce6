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
        <ul className="divide-y divide-rule text-sm" aria-label="Share links of this stack">
          {links.map((l) => (
            <li key={l.id} className="flex flex-wrap items-start justify-between gap-x-3 gap-y-1 py-1.5">
              <div className="min-w-0">
                <p className="break-all">
                  {l.email} <span className={l.status === 'active' ? 'font-medium text-moss' : 'text-slate'}>· {STATUS_LABEL[l.status]}</span>
                </p>
                <p className="num text-xs text-slate">
                  made {when(l.createdAt)} · {l.status === 'revoked' ? `revoked ${when(l.revokedAt)}` : `expires ${when(l.expiresAt)}${l.status === 'active' ? ` (${timeLeft(l.expiresAt)})` : ''}`}
                  {' · '}{count(l.downloadCount)} download{l.downloadCount === 1 ? '' : 's'}{l.lastDownloadAt ? `, last ${when(l.lastDownloadAt)}` : ''}
                </p>
              </div>
              {canManage && l.status === 'active' ? (
                <Button variant="quiet" disabled={revoke.isPending} onClick={() => revoke.mutate(l.id)} aria-label={`Revoke the share link for ${l.email} made ${when(l.createdAt)}`}>Revoke</Button>
              ) : null}
            </li>
          ))}
        </ul>
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
