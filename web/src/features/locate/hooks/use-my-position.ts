import { useCallback, useEffect, useRef, useState } from 'react';
import type { SiteMap } from '@domain/locate/site-map.schema';

import { positionOnPlan, type PlanPosition } from '../utils/my-position';

export type MyPositionState =
  | { status: 'off' }
  | { status: 'waiting' }
  | { status: 'on'; position: PlanPosition }
  | { status: 'error'; message: string };

/** What a refused or failed geolocation request means to the viewer (GeolocationPositionError codes 1–3). */
export function geolocationErrorMessage(code: number | undefined): string {
  if (code === 1) return 'Location permission was refused, so your position cannot be shown. Allow location for this site in the browser settings, or measure from the reference points.';
  if (code === 3) return 'Your phone did not find its position in time. Try again in the open, away from the house, or measure from the reference points.';
  return 'Your position is not available on this device. Measure from the reference points.';
}

/**
 * The phone's position on the site plan while switched on: `watchPosition` with high accuracy, each fix
 * converted through the site's local tangent plane. Stops watching when switched off or unmounted.
 */
export function useMyPosition(frame: SiteMap['frame']) {
  const [state, setState] = useState<MyPositionState>({ status: 'off' });
  const watchId = useRef<number | undefined>(undefined);
  const frameRef = useRef(frame);
  frameRef.current = frame;

  const stop = useCallback(() => {
    if (watchId.current !== undefined) navigator.geolocation?.clearWatch(watchId.current);
    watchId.current = undefined;
  }, []);

  const start = useCallback(() => {
    stop();
    if (typeof navigator === 'undefined' || !navigator.geolocation) {
      setState({ status: 'error', message: geolocationErrorMessage(undefined) });
      return;
    }
    setState({ status: 'waiting' });
    watchId.current = navigator.geolocation.watchPosition(
      (fix) => {
        const position = positionOnPlan(frameRef.current, fix.coords);
        if (position) setState({ status: 'on', position });
      },
      (error) => {
        stop();
        setState({ status: 'error', message: geolocationErrorMessage(error.code) });
      },
      { enableHighAccuracy: true, maximumAge: 5_000, timeout: 30_000 },
    );
  }, [stop]);

  const toggle = useCallback(() => {
    if (state.status === 'on' || state.status === 'waiting') {
      stop();
      setState({ status: 'off' });
    } else {
      start();
    }
  }, [start, state.status, stop]);

  useEffect(() => stop, [stop]);
  return { state, toggle };
}
