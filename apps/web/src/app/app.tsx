import { QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';
import { RouterProvider } from 'react-router';
import { createQueryClient } from '../lib/query-client';
import { createAppRouter } from './router';

export function App() {
  const [client] = useState(createQueryClient);
  const [router] = useState(() => createAppRouter(client));
  return (
    <QueryClientProvider client={client}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  );
}
