import { Button, Field, Input, Spinner, Text } from '@fluentui/react-components';
import { ArrowRotateClockwise24Regular, ArrowRotateCounterclockwise24Regular, Checkmark24Regular } from '@fluentui/react-icons';

import { normalizeDegrees } from '../utils/plan-geometry';

import { usePanelStyles } from './panel-styles';

type NorthPanelProps = {
  value: string;
  onChange: (value: string) => void;
  error?: string;
  isSaving: boolean;
  isChanged: boolean;
  onSave: () => void;
};

/** The true bearing of the plan's "up", typed or turned a step at a time; the arrow on the plan follows. */
export function NorthPanel({ value, onChange, error, isSaving, isChanged, onSave }: NorthPanelProps) {
  const styles = usePanelStyles();
  const turn = (step: number) => {
    const current = Number(value.replace(',', '.'));
    onChange(String(normalizeDegrees((Number.isFinite(current) ? current : 0) + step)));
  };
  return (
    <section className={styles.panel} aria-label="North">
      <Text>Which way is true north? Give the compass bearing of the plan’s top edge (0° when the plan is drawn north-up, 90° when its top faces east).</Text>
      <Field label="Bearing of the plan’s top, degrees clockwise from north" validationMessage={error}>
        <Input className={styles.control} inputMode="decimal" value={value} onChange={(_e, d) => onChange(d.value)} />
      </Field>
      <div className={styles.actions}>
        <Button className={styles.button} icon={<ArrowRotateCounterclockwise24Regular />} onClick={() => turn(-10)} aria-label="Turn the plan's top 10 degrees anticlockwise">
          −10°
        </Button>
        <Button className={styles.button} onClick={() => turn(-1)} aria-label="Turn the plan's top 1 degree anticlockwise">
          −1°
        </Button>
        <Button className={styles.button} onClick={() => turn(1)} aria-label="Turn the plan's top 1 degree clockwise">
          +1°
        </Button>
        <Button className={styles.button} icon={<ArrowRotateClockwise24Regular />} iconPosition="after" onClick={() => turn(10)} aria-label="Turn the plan's top 10 degrees clockwise">
          +10°
        </Button>
      </div>
      <div className={styles.actions}>
        <Button
          appearance="primary"
          className={styles.button}
          icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />}
          disabled={isSaving || !isChanged}
          onClick={onSave}
        >
          Save north
        </Button>
      </div>
    </section>
  );
}
