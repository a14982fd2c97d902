import { FluentProvider, makeStyles } from '@fluentui/react-components';
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import type { ReactNode } from 'react';

import { AppErrorBoundary } from '../components/errors/app-error-boundary';
import { usePrefersDarkScheme } from '../lib/use-prefers-dark-scheme';

import { darkTheme, lightTheme } from './theme';

const useStyles = makeStyles({
  root: { minHeight: '100dvh' },
});

type AppProviderProps = {
  queryClient: QueryClient;
  children: ReactNode;
};

export function AppProvider({ queryClient, children }: AppProviderProps) {
  const styles = useStyles();
  const prefersDark = usePrefersDarkScheme();
  return (
    <FluentProvider theme={prefersDark ? darkTheme : lightTheme} className={styles.root}>
      <AppErrorBoundary>
        <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
      </AppErrorBoundary>
    </FluentProvider>
  );
}
