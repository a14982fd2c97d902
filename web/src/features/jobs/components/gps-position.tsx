import { Button, makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { MyLocation20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import type { SiteFrame } from '@domain/as-built/as-built.schema';

import { useFormStyles } from '../../../components/form-styles';
import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { requestPhoneFix, type GpsFix } from '../utils/phone-fix';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', alignItems: 'flex-start', gap: tokens.spacingVerticalS },
  weak: { color: tokens.colorPaletteDarkOrangeForeground1 },
});

export type { GpsFix } from '../utils/phone-fix';

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
    setState({ status: 'waiting' });
    requestPhoneFix(site).then(
      (next) => {
        setState({ status: 'idle' });
        onChange(next);
      },
      (error: Error) => setState({ status: 'error', message: error.message }),
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
