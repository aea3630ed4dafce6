import { useEffect, useRef } from 'react';
import type { StackDetailView } from '@shared/schemas/bundles';
import { Button } from '@/components/button';
import { ErrorNote } from '@/components/query-state';
import { count } from '@/lib/units';
import { contactSheetUrl } from '../api/get-stack';
import { useRequestContactSheet } from '../api/request-contact-sheet';

interface Props {
  studioId: string;
  stack: StackDetailView;
  canEdit: boolean;
}

/** The contact sheet of the stack's current version: the JPEG shown, the PDF linked. */
export function ContactSheetPanel({ studioId, stack, canEdit }: Props) {
  const sheet = stack.contactSheet;
  const request = useRequestContactSheet(studioId, stack.id);
  // Editors opening a stack whose current version has no sheet get one made, once per version.
  const asked = useRef<string | null>(null);
  const versionKey = `${stack.id}:${stack.version}`;
  const { mutate } = request;
  useEffect(() => {
    if (!canEdit || sheet.status !== 'none' || stack.counts.included === 0 || asked.current === versionKey) return;
    asked.current = versionKey;
    mutate();
  }, [canEdit, sheet.status, stack.counts.included, versionKey, mutate]);

  const jpg = contactSheetUrl(studioId, stack.id, stack.version, 'jpg');
  const pdf = contactSheetUrl(studioId, stack.id, stack.version, 'pdf');
  return (
    <section aria-labelledby="sheet-h" className="rounded border border-rule bg-card p-4">
      <h2 id="sheet-h" className="text-lg font-semibold">Contact sheet</h2>
      <p className="text-sm text-slate">Every frame of the bundle, numbered as its files, with capture time, exposure and check marks.</p>
      <div className="mt-3" aria-live="polite">
        {stack.counts.included === 0 ? <p className="text-sm text-slate">Every frame is excluded: there is nothing to show.</p> : null}
        {stack.counts.included > 0 && sheet.status === 'none' ? (
          <p className="text-sm text-slate">{canEdit ? 'Asking for the contact sheet…' : 'No contact sheet for this version yet; a photographer’s visit to this page makes one.'}</p>
        ) : null}
        {sheet.status === 'queued' || sheet.status === 'running' ? (
          <p className="text-sm text-slate" role="status">
            Making the contact sheet of version {stack.version}{stack.counts.previewsPending ? ` (waiting for ${count(stack.counts.previewsPending)} previews)` : ''}…
          </p>
        ) : null}
        {sheet.status === 'failed' ? <p role="alert" className="text-sm text-clay">{sheet.error ?? 'The contact sheet could not be made.'}</p> : null}
        {sheet.status === 'done' ? (
          <>
            <a href={jpg} target="_blank" rel="noreferrer" className="block w-fit" title="Open the full-size JPEG">
              <img src={jpg} alt={`Contact sheet of ${stack.name}, version ${stack.version}: ${count(stack.counts.included)} frames in order`} className="max-h-[36rem] max-w-full rounded border border-rule" />
            </a>
            <p className="num mt-2 flex flex-wrap gap-x-4 text-sm">
              <a href={jpg} target="_blank" rel="noreferrer" className="text-moss hover:underline">JPEG{sheet.widthPx ? ` (${sheet.widthPx} × ${sheet.heightPx} px)` : ''}</a>
              <a href={pdf} target="_blank" rel="noreferrer" className="text-moss hover:underline">PDF{sheet.pages ? ` (${count(sheet.pages)} A4 page${sheet.pages === 1 ? '' : 's'})` : ''}</a>
            </p>
            {sheet.missingPreviews > 0 ? <p className="mt-1 text-sm text-amber">{count(sheet.missingPreviews)} frames had no preview and show as grey cells.</p> : null}
          </>
        ) : null}
      </div>
      {canEdit && (sheet.status === 'failed' || (sheet.status === 'done' && sheet.missingPreviews > 0 && stack.counts.previewsPending === 0)) ? (
        <Button className="mt-3" variant="secondary" disabled={request.isPending} onClick={() => request.mutate()}>Make the contact sheet again</Button>
      ) : null}
      {request.error ? <div className="mt-2"><ErrorNote error={request.error} /></div> : null}
    </section>
  );
}
