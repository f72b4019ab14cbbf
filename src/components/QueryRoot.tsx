import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState, type ComponentType } from 'react';

/** Gives an island its own query cache (islands hydrate separately, so each needs a provider). */
export function withQueryClient<P extends object>(Component: ComponentType<P>): ComponentType<P> {
  function WithQueryClient(props: P) {
    const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { retry: 1, staleTime: 30_000 } } }));
    return (
      <QueryClientProvider client={client}>
        <Component {...props} />
      </QueryClientProvider>
    );
  }
  WithQueryClient.displayName = `withQueryClient(${Component.displayName ?? Component.name})`;
  return WithQueryClient;
}
