import { Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { MyLocation20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import type { SiteFrame } from '@domain/as-built/as-built.schema';
import { createLocalFrame, wgs84ToPlan } from '@domain/geometry/local-tangent-plane';

import { useFormStyles } from '../../../components/form-styles';
import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', alignItems: 'flex-start', gap: tokens.spacingVerticalS },
  weak: { color: tokens.colorPaletteDarkOrangeForeground1 },
});

/** A phone fix on the site plan (metres), with the phone's stated accuracy radius (metres). */
export type GpsFix = { x: number; y: number; accuracyM: number };

/**
 * A phone position (WGS 84 degrees, as `navigator.geolocation` reports it) on the plan through the
 * site's local tangent plane (origin + the plan's north azimuth), the same conversion as the locate
 * map. Undefined without a GPS origin.
 */
export function gpsFixOnPlan(site: SiteFrame | undefined, coords: { latitude: number; longitude: number; accuracy: number }): GpsFix | undefined {
  if (!site?.origin) return undefined;
  const p = wgs84ToPlan(createLocalFrame(site.origin, site.northAzimuthDeg), coords.latitude, coords.longitude);
  return { x: p.x, y: p.y, accuracyM: Math.min(10_000, Math.max(0, coords.accuracy)) };
}

function failureOf(code: number | undefined): string {
  if (code === 1) return 'Location permission was refused: allow it for this site in the browser settings, or tape ties.';
  if (code === 3) return 'The phone did not find its position in time. Try again in the open, or tape ties.';
  return 'This device cannot give its position. Tape ties instead.';
}

type GpsPositionProps = {
  site: SiteFrame | undefined;
  fix: GpsFix | null;
  onChange: (fix: GpsFix | null) => void;
};

/**
 * "Use my position" (issue 17): where the site has a WGS 84 origin, the phone's position with its
 * accuracy is stored as the item's position with source `gps`. Said plainly to be weaker than ties.
 */
export function GpsPosition({ site, fix, onChange }: GpsPositionProps) {
  const styles = useStyles();
  const formStyles = useFormStyles();
  const [units] = useUnitPreferences();
  const [state, setState] = useState<{ status: 'idle' | 'waiting' } | { status: 'error'; message: string }>({ status: 'idle' });
  if (!site?.origin) return null;

  const locate = () => {
    if (typeof navigator === 'undefined' || !navigator.geolocation) {
      setState({ status: 'error', message: failureOf(undefined) });
      return;
    }
    setState({ status: 'waiting' });
    navigator.geolocation.getCurrentPosition(
      (position) => {
        const next = gpsFixOnPlan(site, position.coords);
        setState({ status: 'idle' });
        if (next) onChange(next);
      },
      (error) => setState({ status: 'error', message: failureOf(error.code) }),
      { enableHighAccuracy: true, maximumAge: 0, timeout: 30_000 },
    );
  };

  return (
    <div className={styles.root}>
      <Button
        className={formStyles.button}
        icon={state.status === 'waiting' ? <Spinner size="tiny" /> : <MyLocation20Regular />}
        disabled={state.status === 'waiting'}
        onClick={locate}
      >
        Use my position
      </Button>
      {fix && (
        <Text className={styles.weak} aria-live="polite">
          Phone position: x {formatLength(fix.x, units.length, 'long')}, y {formatLength(fix.y, units.length, 'long')}, good to about ±
          {formatLength(fix.accuracyM, units.length, 'long')}. A phone fix is several times weaker than taped ties; ties, when they meet, place
          the item instead.{' '}
          <Button appearance="transparent" size="small" onClick={() => onChange(null)}>
            Forget it
          </Button>
        </Text>
      )}
      {state.status === 'error' && <Text className={styles.weak}>{state.message}</Text>}
    </div>
  );
}
