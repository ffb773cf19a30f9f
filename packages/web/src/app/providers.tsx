import { BlueprintProvider } from '@blueprintjs/core';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { lazy, type ReactNode, Suspense } from 'react';
import { ThemeProvider } from './theme';

const Devtools = import.meta.env.DEV
  ? lazy(() =>
      import('@tanstack/react-query-devtools').then((m) => ({ default: m.ReactQueryDevtools })),
    )
  : () => null;

export function AppProviders({ client, children }: { client: QueryClient; children: ReactNode }) {
  return (
    <QueryClientProvider client={client}>
      <ThemeProvider>
        <BlueprintProvider>{children}</BlueprintProvider>
      </ThemeProvider>
      <Suspense fallback={null}>
        <Devtools />
      </Suspense>
    </QueryClientProvider>
  );
}
