import { QueryClientProvider } from '@tanstack/react-query';
import { RouterProvider } from 'react-router-dom';
import { queryClient } from '../lib/query-client';
import { FormatProvider } from '../lib/format';
import { router } from './router';

export function AppProvider() {
  return (
    <QueryClientProvider client={queryClient}>
      <FormatProvider>
        <RouterProvider router={router} />
      </FormatProvider>
    </QueryClientProvider>
  );
}
