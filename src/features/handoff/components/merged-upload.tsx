import { useId, useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/button';
import { ApiError } from '@/lib/api-client';
import { bytes } from '../lib/format';
import { uploadMerged } from '../api/upload-merged';

interface Props<T> {
  /** Where the file goes: the stack's hand-off or the share link. */
  url: string;
  onUploaded: (result: T) => void;
  /** Names the stack for screen readers when several forms share a page. */
  stackName: string;
}

/** Picks the merged JPEG or TIFF and sends it, with its progress; the server checks the content. */
export function MergedUpload<T>({ url, onUploaded, stackName }: Props<T>) {
  const inputId = useId();
  const [file, setFile] = useState<File | null>(null);
  const [loadedBytes, setLoadedBytes] = useState(0);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const abort = useRef<AbortController | null>(null);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    if (!file) return setError('Choose the merged picture first (a JPEG or TIFF file).');
    setBusy(true);
    setError(null);
    setLoadedBytes(0);
    abort.current = new AbortController();
    try {
      const result = await uploadMerged<T>(url, file, { onProgress: setLoadedBytes, signal: abort.current.signal });
      setFile(null);
      onUploaded(result);
    } catch (err) {
      setError(err instanceof ApiError ? (err.fieldError('file') ?? err.message) : 'The upload failed.');
    } finally {
      setBusy(false);
    }
  };

  const percent = file && file.size > 0 ? Math.round((loadedBytes / file.size) * 100) : 0;
  return (
    <form onSubmit={submit} className="space-y-2" aria-label={`Upload the merged result of ${stackName}`} noValidate>
      <div className="flex flex-col gap-1">
        <label htmlFor={inputId} className="text-sm font-medium text-ink">Merged picture <span className="font-normal text-slate">(JPEG or TIFF)</span></label>
        <input
          id={inputId}
          type="file"
          accept=".jpg,.jpeg,.tif,.tiff,image/jpeg,image/tiff"
          disabled={busy}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${inputId}-error` : undefined}
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setError(null);
          }}
          className="text-sm file:mr-3 file:rounded file:border file:border-rule file:bg-card file:px-3 file:py-1 file:text-ink"
        />
      </div>
      {busy && file ? (
        <div className="flex items-center gap-2 text-sm" role="status">
          <progress value={loadedBytes} max={file.size || 1} className="h-2 w-48 accent-moss" aria-label={`Uploading ${file.name}`} />
          <span className="num">{percent} % of {bytes(file.size)}</span>
          <Button variant="quiet" onClick={() => abort.current?.abort()}>Stop</Button>
        </div>
      ) : null}
      {error ? <p id={`${inputId}-error`} role="alert" className="text-sm text-clay">{error}</p> : null}
      <Button type="submit" disabled={busy}>{busy ? 'Uploading…' : 'Upload merged result'}</Button>
    </form>
  );
}
