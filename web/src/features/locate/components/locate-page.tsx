import { Component, type ReactNode, useEffect, useState } from 'react';

import { LogoMark } from '../../../components/logo';
import { PlainSpinner } from '../../../components/plain/controls';
import { Text } from '../../../components/plain/text';
import { type LocateViewResponse, unavailableReason } from '../api/get-locate-view';

import { LocateUnavailable } from './locate-unavailable';
import { LocateView } from './locate-view';
import styles from './locate-view.module.css';

function Frame({ installer, children }: { installer?: string; children: ReactNode }) {
  return (
    <div className={styles.page}>
      <header className={styles.header}>
        <LogoMark size={24} />
        <Text weight="semibold">{installer ? `Buried cables · ${installer}` : 'Buried cables'}</Text>
      </header>
      <main className={styles.main}>{children}</main>
    </div>
  );
}

export type LocateState = { status: 'pending' } | { status: 'ready'; view: LocateViewResponse } | { status: 'unavailable'; reason: ReturnType<typeof unavailableReason> };

/** The page's state from the settled request for the link's view. */
export function settledState(view: Promise<LocateViewResponse>): Promise<LocateState> {
  return view.then(
    (answer): LocateState => ({ status: 'ready', view: answer }),
    (error: unknown): LocateState => ({ status: 'unavailable', reason: unavailableReason(error) }),
  );
}

/**
 * The public locate page (locate.html): a contractor with the link sees what is buried at the site, and
 * how deep. `view` is the request for the link's view, started before the first render (locate-main.tsx)
 * so the frame draws at once on a weak signal and the map follows; a refused link is a page of its own.
 * `initial`: the answer when it came before the first render (the page's Link preload), drawn at once
 * instead of a loading frame that would show for an instant.
 */
export function LocatePage({ view, initial }: { view: Promise<LocateViewResponse>; initial?: LocateState }) {
  const [state, setState] = useState<LocateState>(initial ?? { status: 'pending' });
  useEffect(() => {
    if (initial && initial.status !== 'pending') return;
    let current = true;
    void settledState(view).then((settled) => current && setState(settled));
    return () => {
      current = false;
    };
  }, [view, initial]);

  if (state.status === 'pending') {
    return (
      <Frame>
        <PlainSpinner label="Loading the map…" />
      </Frame>
    );
  }
  if (state.status === 'unavailable') {
    return (
      <Frame>
        <LocateUnavailable reason={state.reason} />
      </Frame>
    );
  }
  return (
    <Frame installer={state.view.installer.companyName}>
      <LocateView view={state.view} />
    </Frame>
  );
}

/** A page that failed to draw says so in the page's own words instead of going blank. */
export class LocateErrorBoundary extends Component<{ children: ReactNode }, { failed: boolean }> {
  override state = { failed: false };

  static getDerivedStateFromError(): { failed: boolean } {
    return { failed: true };
  }

  override render(): ReactNode {
    if (!this.state.failed) return this.props.children;
    return (
      <Frame>
        <LocateUnavailable reason="error" />
      </Frame>
    );
  }
}
