import { useId, useRef, useState } from 'react';
import type { NewShareLink } from '@shared/schemas/handoff';
import { Button } from '@/components/button';
import { timeLeft, when } from '../lib/format';

/** A share link right after it was made: the only time its address is shown. */
export function NewLinkNotice({ link, onDismiss }: { link: NewShareLink; onDismiss: () => void }) {
  const inputId = useId();
  const input = useRef<HTMLInputElement>(null);
  const [copied, setCopied] = useState<'yes' | 'no' | null>(null);
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(link.url);
      setCopied('yes');
    } catch {
      input.current?.select();
      setCopied('no');
    }
  };
  return (
    <div className="space-y-2 rounded border border-moss/40 bg-moss/5 p-3" role="region" aria-label="New share link">
      <label htmlFor={inputId} className="block text-sm font-medium">Share link for {link.email}</label>
      <div className="flex flex-wrap gap-2">
        <input id={inputId} ref={input} readOnly value={link.url} onFocus={(e) => e.target.select()} className="min-w-0 flex-1 rounded border border-rule bg-card px-2 py-1 font-mono text-xs" />
        <Button variant="secondary" onClick={copy}>Copy link</Button>
      </div>
      <p className="text-sm text-slate" aria-live="polite">
        {copied === 'yes' ? 'Copied. ' : copied === 'no' ? 'Copying was refused by the browser: the link is selected, copy it with the keyboard. ' : ''}
        It was e-mailed to {link.email} and is shown here only this once. Valid until {when(link.expiresAt)} ({timeLeft(link.expiresAt)}).
      </p>
      <Button variant="quiet" onClick={onDismiss}>Done</Button>
    </div>
  );
}
