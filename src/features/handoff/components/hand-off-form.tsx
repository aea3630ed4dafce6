import { useState, type FormEvent } from 'react';
import type { HandoffView } from '@shared/schemas/handoff';
import { SHARE_LINK_DEFAULT_DAYS, SHARE_LINK_MAX_DAYS } from '@shared/schemas/handoff';
import { Button } from '@/components/button';
import { SelectField } from '@/components/select-field';
import { TextField } from '@/components/text-field';
import { ApiError } from '@/lib/api-client';
import { useHandOffStack, type HandOffResult } from '../api/hand-off-stack';

interface Props {
  studioId: string;
  view: HandoffView;
  onHandedOff: (result: HandOffResult) => void;
}

/** Hands a ready stack to a retoucher of the studio, or by e-mail to someone outside it. */
export function HandOffForm({ studioId, view, onHandedOff }: Props) {
  const handOff = useHandOffStack(studioId, view.stack.id);
  const [to, setTo] = useState<'member' | 'email'>(view.retouchers.length ? 'member' : 'email');
  const [retoucherUserId, setRetoucherUserId] = useState(view.retouchers[0]?.userId ?? '');
  const [email, setEmail] = useState('');
  const [expiryDays, setExpiryDays] = useState(String(SHARE_LINK_DEFAULT_DAYS));
  const err = handOff.error instanceof ApiError ? handOff.error : null;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const input = to === 'member' ? { to, retoucherUserId } : { to, email, expiryDays: Number(expiryDays) };
    handOff.mutate(input, { onSuccess: onHandedOff });
  };

  return (
    <form onSubmit={submit} className="space-y-3" noValidate>
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium">Hand off to</legend>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="handoff-to" value="member" checked={to === 'member'} onChange={() => setTo('member')} className="accent-moss" />
          A retoucher of the studio
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="radio" name="handoff-to" value="email" checked={to === 'email'} onChange={() => setTo('email')} className="accent-moss" />
          Someone outside the studio, by e-mail (a share link)
        </label>
      </fieldset>
      {to === 'member' ? (
        view.retouchers.length ? (
          <SelectField label="Retoucher" value={retoucherUserId} onChange={(e) => setRetoucherUserId(e.target.value)} error={err?.fieldError('retoucherUserId')}>
            {view.retouchers.map((r) => <option key={r.userId} value={r.userId}>{r.name || r.email} ({r.email})</option>)}
          </SelectField>
        ) : (
          <p className="text-sm text-slate">The studio has no retoucher yet. An owner can invite one from the Studio page, or hand off by e-mail.</p>
        )
      ) : (
        <div className="grid gap-3 sm:grid-cols-[1fr_9rem]">
          <TextField label="E-mail" type="email" autoComplete="off" value={email} onChange={(e) => setEmail(e.target.value)} error={err?.fieldError('email')} />
          <TextField
            label="Link valid for" unit="days" type="number" inputMode="numeric" min={1} max={SHARE_LINK_MAX_DAYS} step={1}
            value={expiryDays} onChange={(e) => setExpiryDays(e.target.value)} error={err?.fieldError('expiryDays')} hint={`1–${SHARE_LINK_MAX_DAYS} days`}
          />
        </div>
      )}
      {handOff.error && !(err?.details?.length) ? <p role="alert" className="text-sm text-clay">{handOff.error.message}</p> : null}
      <Button type="submit" disabled={handOff.isPending || (to === 'member' && !retoucherUserId)}>{handOff.isPending ? 'Handing off…' : 'Hand off'}</Button>
    </form>
  );
}
