import { FluentProvider } from '@fluentui/react-components';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';

import { AppUpdateBar } from '../components/app-update';
import { AppErrorBoundary } from '../components/errors/app-error-boundary';
import { AppToaster } from '../components/notify';
import { usePrefersDarkScheme } from '../lib/use-prefers-dark-scheme';

import { darkTheme, lightTheme } from './theme';

type AppProviderProps = {
  queryClient: QueryClient;
  children: ReactNode;
};

export function AppProvider({ queryClient, children }: AppProviderProps) {
  const prefersDark = usePrefersDarkScheme();
  return (
    <FluentProvider theme={prefersDark ? darkTheme : lightTheme}>
      <AppErrorBoundary>
        <QueryClientProvider client={queryClient}>
          {children}
          <AppToaster />
          <AppUpdateBar />
        </QueryClientProvider>
      </AppErrorBoundary>
    </FluentProvider>
  );
}
