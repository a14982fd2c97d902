import { Field, makeStyles, mergeClasses, Radio, RadioGroup, tokens } from '@fluentui/react-components';
import type { GaugeUnits, LengthUnits } from '@domain/settings/settings.schema';

import { GAUGE_UNIT_LABELS, LENGTH_UNIT_LABELS } from '../../../lib/units';
import { useMyUnitChoice, useUnitPreferences } from '../../../lib/use-unit-preferences';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexWrap: 'wrap',
    gap: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalXXL}`,
    paddingBlockStart: tokens.spacingVerticalL,
    borderTop: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
  },
  // On a settings card the card is the frame: no rule above.
  bare: { borderTop: 'none', paddingBlockStart: 0 },
  radio: { minHeight: '44px' },
});

const COMPANY = 'company';

/**
 * The signed-in person's own units, kept on their account (every value is stored in metres whatever is
 * chosen). "Company default" follows what the admin set for the company.
 */
export function UnitsChooser({ isBare = false }: { isBare?: boolean }) {
  const styles = useStyles();
  const [units, setUnits] = useUnitPreferences();
  const { own, company } = useMyUnitChoice();
  // Before the server has answered (or offline), the units shown count as the person's own.
  const lengthChoice: LengthUnits | null = own ? own.lengthUnits : units.length;
  const gaugeChoice: GaugeUnits | null = own ? own.gaugeUnits : units.gauge;
  const companyLabel = (label: string | undefined) => (label ? `Company default (${label})` : 'Company default');

  return (
    <div className={mergeClasses(styles.root, isBare && styles.bare)}>
      <Field label="Your lengths">
        <RadioGroup
          value={lengthChoice ?? COMPANY}
          onChange={(_e, d) => setUnits({ length: d.value === COMPANY ? null : (d.value as LengthUnits), gauge: gaugeChoice })}
        >
          <Radio className={styles.radio} value={COMPANY} label={companyLabel(company && LENGTH_UNIT_LABELS[company.length])} />
          <Radio className={styles.radio} value="imperial" label={LENGTH_UNIT_LABELS.imperial} />
          <Radio className={styles.radio} value="metric" label={LENGTH_UNIT_LABELS.metric} />
        </RadioGroup>
      </Field>
      <Field label="Your wire sizes">
        <RadioGroup
          value={gaugeChoice ?? COMPANY}
          onChange={(_e, d) => setUnits({ length: lengthChoice, gauge: d.value === COMPANY ? null : (d.value as GaugeUnits) })}
        >
          <Radio className={styles.radio} value={COMPANY} label={companyLabel(company && GAUGE_UNIT_LABELS[company.gauge])} />
          <Radio className={styles.radio} value="awg" label={GAUGE_UNIT_LABELS.awg} />
          <Radio className={styles.radio} value="mm2" label={GAUGE_UNIT_LABELS.mm2} />
        </RadioGroup>
      </Field>
    </div>
  );
}
