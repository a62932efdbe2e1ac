import { QueryClientProvider } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { RouterProvider } from 'react-router';
import { onAnswered, startOutbox } from '../lib/outbox';
import { createQueryClient } from '../lib/query-client';
import { createAppRouter } from './router';

export function App() {
  const [client] = useState(createQueryClient);
  const [router] = useState(() => createAppRouter(client));
  useEffect(() => {
    const stop = startOutbox();
    // A write that went out later (after a reconnect) changes what the rink's screens show.
    const unsubscribe = onAnswered((write) => void client.invalidateQueries({ queryKey: ['rink', write.rinkSlug] }));
    return () => {
      stop();
      unsubscribe();
    };
  }, [client]);
  return (
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
