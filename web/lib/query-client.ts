// The app's one QueryClient, shared by the provider and the route loaders that prefetch into it.
import { QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

export const queryClient = new QueryClient({
  defaultOptions: {
    queries: {
      staleTime: 30_000,
      // Only a lost connection or a server hiccup may go away on a retry; a 4xx answer or a
      // response that fails its schema will not.
      retry: (failureCount, error) =>
        failureCount < 2 && isApiError(error) && (error.status === 0 || error.status >= 500),
      refetchOnWindowFocus: false,
    },
    mutations: { retry: false },
  },
});
