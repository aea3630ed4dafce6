import { useEffect, useState, useSyncExternalStore } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { CardImportEngine } from '../lib/card-import-engine';
import { sortingQueryOptions } from '../api/get-sorting';
import { sessionFilesQueryOptions } from '../api/get-session-files';
import { sessionQueryOptions } from '../api/get-session';
import { sessionsQueryOptions } from '../api/get-sessions';

/** One card import engine per session page; the sorting and file lists reload when it completes. */
export function useCardImport(studioId: string, sessionId: string) {
  const qc = useQueryClient();
  const [engine] = useState(
    () =>
      new CardImportEngine(studioId, sessionId, () => {
        for (const key of [sortingQueryOptions(studioId, sessionId).queryKey, sessionFilesQueryOptions(studioId, sessionId).queryKey, sessionQueryOptions(studioId, sessionId).queryKey]) {
          void qc.invalidateQueries({ queryKey: key, exact: true });
        }
        void qc.invalidateQueries({ queryKey: sessionsQueryOptions(studioId).queryKey, exact: true });
      }),
  );
  const snapshot = useSyncExternalStore(engine.subscribe, engine.getSnapshot);
  const busy = snapshot.phase === 'running' || snapshot.phase === 'finishing';
  useEffect(() => {
    if (!busy) return;
    // Leaving mid-import loses nothing stored, but the files still in flight would need picking again.
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [busy]);
  useEffect(() => () => engine.stop(), [engine]);
  return { engine, snapshot, busy };
}
