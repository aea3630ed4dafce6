import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router';
import { queryClient } from '@/lib/react-query';
import { setUnauthenticatedHandler } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/get-me';
import { router } from './router';

// A 401 from any request means the session ended: forget who we were; the shell sends to sign-in.
setUnauthenticatedHandler(() => queryClient.setQueryData(meQueryOptions().queryKey, null));

export function AppProviders() {
  return (
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
