import { Button, makeStyles, Text, tokens } from '@fluentui/react-components';
import { Component, type ErrorInfo, type ReactNode } from 'react';

const useStyles = makeStyles({
  root: {
    minHeight: '100dvh',
    display: 'flex',
    flexDirection: 'column',
    alignItems: 'center',
    justifyContent: 'center',
    gap: tokens.spacingVerticalL,
    padding: tokens.spacingHorizontalXL,
    textAlign: 'center',
  },
  button: { minHeight: '44px' },
});

function AppErrorFallback() {
  const styles = useStyles();
  return (
    <div role="alert" className={styles.root}>
      <Text as="h1" block size={600} weight="semibold">
        Loamline stopped working
      </Text>
      <Text as="p" block>Something unexpected went wrong on this screen. Reloading the page usually fixes it.</Text>
      <Button appearance="primary" className={styles.button} onClick={() => window.location.reload()}>
        Reload the page
      </Button>
    </div>
  );
}

type AppErrorBoundaryProps = { children: ReactNode };
type AppErrorBoundaryState = { hasError: boolean };

/**
 * Last line of defence for errors outside any route (providers, the router itself). Route errors are
 * handled closer to where they happen, by each route's ErrorBoundary.
 */
export class AppErrorBoundary extends Component<AppErrorBoundaryProps, AppErrorBoundaryState> {
  override state: AppErrorBoundaryState = { hasError: false };

  static getDerivedStateFromError(): AppErrorBoundaryState {
    return { hasError: true };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.error('Unhandled error in the app', error, info.componentStack);
  }

  override render(): ReactNode {
    return this.state.hasError ? <AppErrorFallback /> : this.props.children;
  }
}
