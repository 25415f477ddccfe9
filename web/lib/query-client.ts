// The app's one QueryClient, shared by the provider and the route loaders that prefetch into it.
import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // Client errors (401, 403, 404, 422…) will not change on a retry; network blips might.
      retry: (failureCount, error) =>
        failureCount < 2 && !(isApiError(error) && error.status >= 400 && error.status < 500),
      refetchOnWindowFocus: false,
    },
    mutations: { retry: false },
  },
});
