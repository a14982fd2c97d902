import { Field, makeStyles, Radio, RadioGroup, tokens } from '@fluentui/react-components';

import { useUnitPreferences } from '../../../lib/use-unit-preferences';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalXXL}`,
    paddingBlockStart: tokens.spacingVerticalL,
    borderTop: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  radio: { minHeight: '44px' },
});

/** Units on this device (every value is stored in metres whatever is chosen). */
export function UnitsChooser() {
  const styles = useStyles();
  const [units, setUnits] = useUnitPreferences();
  return (
    <div className={styles.root}>
      <Field label="Lengths on this device">
        <RadioGroup layout="horizontal" value={units.length} onChange={(_e, d) => setUnits({ ...units, length: d.value as 'imperial' | 'metric' })}>
          <Radio className={styles.radio} value="imperial" label="Feet and inches" />
          <Radio className={styles.radio} value="metric" label="Metres and centimetres" />
        </RadioGroup>
      </Field>
      <Field label="Wire sizes">
        <RadioGroup layout="horizontal" value={units.gauge} onChange={(_e, d) => setUnits({ ...units, gauge: d.value as 'awg' | 'mm2' })}>
          <Radio className={styles.radio} value="awg" label="AWG" />
          <Radio className={styles.radio} value="mm2" label="mm²" />
        </RadioGroup>
      </Field>
    </div>
  );
}
