import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StackDetailView } from '@shared/schemas/bundles';

/** How often the stack is read again while its previews or contact sheet are being made. */
export const STACK_POLL_MS = 2000;

const base = (studioId: string, stackId: string) => `/api/studios/${studioId}/stacks/${stackId}`;

export const getStack = (studioId: string, stackId: string) => api.get<StackDetailView>(base(studioId, stackId));

const working = (v: StackDetailView | undefined) =>
  !!v && (v.counts.previewsPending > 0 || v.contactSheet.status === 'queued' || v.contactSheet.status === 'running');

export const stackQueryOptions = (studioId: string, stackId: string) =>
  queryOptions({
    queryKey: ['studios', studioId, 'stacks', stackId],
    queryFn: () => getStack(studioId, stackId),
    refetchInterval: (query) => (working(query.state.data) ? STACK_POLL_MS : false),
  });

export const useStack = (studioId: string, stackId: string) => useQuery(stackQueryOptions(studioId, stackId));

export const stackFramePreviewUrl = (studioId: string, stackId: string, frameId: string, size: 'small' | 'large' = 'small') =>
  `${base(studioId, stackId)}/frames/${frameId}/preview/${size}`;

/** The version in the query string keeps a browser from showing an older version's sheet. */
export const contactSheetUrl = (studioId: string, stackId: string, version: number, ext: 'jpg' | 'pdf') =>
  `${base(studioId, stackId)}/contact-sheet.${ext}?v=${version}`;
