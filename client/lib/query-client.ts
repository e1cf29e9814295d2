import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client.ts';

const MAX_RETRIES = 2;

/** @param onUnauthorized called when any request answers 401, e.g. because the session ended in another tab. */
export function createQueryClient(onUnauthorized: () => void): QueryClient {
  const onError = (error: Error) => {
    if (isApiError(error, 401)) onUnauthorized();
  };
  return new QueryClient({
    queryCache: new QueryCache({ onError }),
    mutationCache: new MutationCache({ onError }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // A 4xx answer will not change by asking again; network trouble and 5xx might.
        retry: (failureCount, error) =>
          failureCount < MAX_RETRIES && !(isApiError(error) && error.status >= 400 && error.status < 500),
      },
    },
  });
}
