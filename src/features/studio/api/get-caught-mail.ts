import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface CaughtMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  receivedAt: string;
}

export const getCaughtMail = (studioId: string) => api.get<{ messages: CaughtMessage[] }>(`/api/studios/${studioId}/dev/mail`).then((r) => r.messages);
export const caughtMailQueryOptions = (studioId: string) =>
  queryOptions({ queryKey: ['studios', studioId, 'caught-mail'], queryFn: () => getCaughtMail(studioId), retry: false });
export const useCaughtMail = (studioId: string, enabled: boolean) => useQuery({ ...caughtMailQueryOptions(studioId), enabled });
