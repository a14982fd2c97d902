import { Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, Field, Input, Spinner } from '@fluentui/react-components';
import { useState, type FormEvent } from 'react';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

import { usePanelStyles } from './panel-styles';

type ReferencePointDialogProps = {
  point: PlanPoint | undefined;
  isSaving: boolean;
  error?: string;
  onSave: (label: string) => void;
  onCancel: () => void;
};

/** Names the reference point just tapped on the plan. */
export function ReferencePointDialog({ point, isSaving, error, onSave, onCancel }: ReferencePointDialogProps) {
  const styles = usePanelStyles();
  const [units] = useUnitPreferences();
  const [label, setLabel] = useState('');
  const [isTouched, setIsTouched] = useState(false);
  const problem = error ?? (isTouched && label.trim() === '' ? 'Give the point a name, e.g. "NE house corner".' : undefined);
  const submit = (event: FormEvent) => {
    event.preventDefault();
    setIsTouched(true);
    if (label.trim() !== '') onSave(label.trim());
  };
  return (
    <Dialog
      open={point !== undefined}
      onOpenChange={(_e, data) => {
        if (!data.open) {
          setLabel('');
          setIsTouched(false);
          onCancel();
        }
      }}
    >
      <DialogSurface>
        <form onSubmit={submit} noValidate>
          <DialogBody>
            <DialogTitle>New reference point</DialogTitle>
            <DialogContent>
              {point && (
                <p>
                  At x {formatLength(point.x, units.length, 'long')}, y {formatLength(point.y, units.length, 'long')} on the plan. Pick something that
                  will still be there in years: a house corner, a gate post, the meter base.
                </p>
              )}
              <Field label="Name" required validationMessage={problem}>
                <Input className={styles.control} value={label} onChange={(_e, d) => setLabel(d.value)} autoFocus />
              </Field>
            </DialogContent>
            <DialogActions fluid>
              <Button
                className={styles.button}
                disabled={isSaving}
                onClick={() => {
                  setLabel('');
                  setIsTouched(false);
                  onCancel();
                }}
              >
                Cancel
              </Button>
              <Button type="submit" appearance="primary" className={styles.button} disabled={isSaving} icon={isSaving ? <Spinner size="tiny" /> : undefined}>
                Add point
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
