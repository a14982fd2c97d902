import { z } from 'zod';
import type { PlanPoint } from '@domain/as-built/common.schema';
import { CreateReferencePointSchema, type CreateReferencePointInput } from '@domain/sites/site.schema';

import { FormDialog, type FormDialogHelpers, FormTextField } from '../../../components/form-dialog';
import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

type ReferencePointValues = { label: string };

/** The name typed, at the point tapped: the site's reference-point request. */
function referencePointFormSchema(point: PlanPoint) {
  return z
    .object({ label: z.string().trim().min(1, 'Give the point a name, e.g. "NE house corner"') })
    .transform(({ label }) => ({ label, x: point.x, y: point.y }))
    .pipe(CreateReferencePointSchema);
}

type ReferencePointDialogProps = {
  /** Where the point was tapped on the plan; the dialog is open while there is one. */
  point: PlanPoint | undefined;
  /**
   * Adds the point (or keeps it on the device with no signal). The dialog stays busy until it settles;
   * close it with `helpers.close()`, or show what the server refused with `helpers.showFieldErrors`.
   */
  onSave: (input: CreateReferencePointInput, helpers: FormDialogHelpers<ReferencePointValues, CreateReferencePointInput>) => Promise<void>;
  onCancel: () => void;
};

/** Names the reference point just tapped on the plan. */
export function ReferencePointDialog({ point, onSave, onCancel }: ReferencePointDialogProps) {
  const [units] = useUnitPreferences();
  // The dialog keeps the last point while it closes, so its schema always has one.
  const at = point ?? { x: 0, y: 0 };
  return (
    <FormDialog
      open={point !== undefined}
      title="New reference point"
      schema={referencePointFormSchema(at)}
      defaultValues={{ label: '' }}
      submitLabel="Add point"
      onOpenChange={(open) => {
        if (!open) onCancel();
      }}
      onSubmit={onSave}
    >
      {(form, fieldError) => (
        <>
          <p>
            At x {formatLength(at.x, units.length, 'long')}, y {formatLength(at.y, units.length, 'long')} on the plan. Pick something that will still
            be there in years: a house corner, a gate post, the meter base.
          </p>
          <FormTextField form={form} name="label" label="Name" required error={fieldError('label')} placeholder="e.g. NE house corner" />
        </>
      )}
    </FormDialog>
  );
}
