import { Button, Field, Input, makeStyles, MessageBar, MessageBarBody, Text, tokens } from '@fluentui/react-components';
import { Add20Regular, Delete20Regular, Edit20Regular } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { type CreateReferencePointInput, CreateReferencePointSchema, type ReferencePointResponse } from '@domain/sites/site.schema';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { formatLength, lengthInputValue, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useDeleteReferencePoint } from '../api/delete-reference-point';
import { useCreateReferencePoint } from '../api/create-reference-point';
import { useUpdateReferencePoint } from '../api/update-reference-point';
import { useSiteConflict } from '../hooks/use-site-conflict';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  row: {
    display: 'flex',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: tokens.spacingHorizontalM,
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  muted: { color: tokens.colorNeutralForeground2 },
  form: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
    '@media (min-width: 640px)': { gridTemplateColumns: 'minmax(0, 2fr) minmax(0, 1fr) minmax(0, 1fr)', columnGap: tokens.spacingHorizontalM },
  },
  actions: { display: 'flex', gap: tokens.spacingHorizontalS, gridColumn: '1 / -1' },
  control: { minHeight: '48px' },
  rowActions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
});

type Field = 'label' | 'x' | 'y';

/**
 * The site's fixed points (house corners, posts) with plan coordinates in metres east (x) and north (y)
 * of the plan origin. Ties on every job of the site are taped from these.
 */
export function ReferencePoints({ siteId, points, canEdit }: { siteId: string; points: ReferencePointResponse[]; canEdit: boolean }) {
  const styles = useStyles();
  const [units] = useUnitPreferences();
  const [editing, setEditing] = useState<string | undefined>();
  const notify = useNotify();
  const remove = useDeleteReferencePoint();
  const restore = useCreateReferencePoint();
  const [deleting, setDeleting] = useState<ReferencePointResponse | undefined>();
  const [deleteError, setDeleteError] = useState<string | undefined>();
  const conflict = useSiteConflict();

  const askDelete = (point: ReferencePointResponse) => {
    setDeleteError(undefined);
    setDeleting(point);
  };

  const putBack = (point: ReferencePointResponse) =>
    restore.mutate(
      { siteId, input: { label: point.label, x: point.x, y: point.y } },
      {
        onSuccess: () => notify.success('Reference point put back', point.label),
        onError: (error) => {
          if (!conflict.handle(error, `putting back “${point.label}”`, () => putBack(point))) {
            notify.error('Could not put the point back', describeRequestError(error));
          }
        },
      },
    );

  const confirmDelete = () => {
    if (!deleting) return;
    const point = deleting;
    remove.mutate(
      { siteId, pointId: point.id },
      {
        onSuccess: () => {
          setDeleting(undefined);
          // Cheap to take back: the same name and coordinates, as a new point.
          notify.undoable(`Reference point “${point.label}” deleted`, () => putBack(point));
        },
        onError: (error) => {
          if (conflict.handle(error, `deleting “${point.label}”`, confirmDelete)) setDeleting(undefined);
          else setDeleteError(describeRequestError(error));
        },
      },
    );
  };

  return (
    <div className={styles.list}>
      {points.length === 0 && <Text className={styles.muted}>No reference points yet.</Text>}
      <ul className={styles.list} aria-label="Reference points">
        {points.map((point) =>
          editing === point.id ? (
            <li key={point.id}>
              <ReferencePointForm siteId={siteId} point={point} onDone={() => setEditing(undefined)} />
            </li>
          ) : (
            <li key={point.id} className={styles.row}>
              <span>
                <Text weight="semibold">{point.label}</Text>{' '}
                <Text className={styles.muted}>
                  x {formatLength(point.x, units.length, 'long')}, y {formatLength(point.y, units.length, 'long')}
                </Text>
              </span>
              {canEdit && (
                <span className={styles.rowActions}>
                  <Button className={styles.control} icon={<Edit20Regular />} onClick={() => setEditing(point.id)} aria-label={`Change ${point.label}`}>
                    Change
                  </Button>
                  <Button className={styles.control} icon={<Delete20Regular />} onClick={() => askDelete(point)} aria-label={`Delete ${point.label}`}>
                    Delete
                  </Button>
                </span>
              )}
            </li>
          ),
        )}
      </ul>
      {canEdit &&
        (editing === 'new' ? (
          <ReferencePointForm siteId={siteId} onDone={() => setEditing(undefined)} />
        ) : (
          <div>
            <Button className={styles.control} icon={<Add20Regular />} onClick={() => setEditing('new')}>
              Add reference point
            </Button>
          </div>
        ))}
      {conflict.dialog}
      <ConfirmDialog
        open={deleting !== undefined}
        title={`Delete the reference point “${deleting?.label ?? ''}”?`}
        confirmLabel="Delete"
        isPending={remove.isPending}
        onConfirm={confirmDelete}
        onCancel={() => setDeleting(undefined)}
      >
        {deleteError && (
          <MessageBar intent="error" layout="multiline">
            <MessageBarBody>{deleteError}</MessageBarBody>
          </MessageBar>
        )}
        <Text as="p" block>
          Ties on this site’s jobs are taped from it, so it cannot be deleted while an item is tied to it: change those ties first.
          A point no tie uses can be deleted.
        </Text>
      </ConfirmDialog>
    </div>
  );
}

/**
 * Adds or changes one reference point of a site (name, metres east and north of the plan origin, typed in
 * the person's units). Also opened from a job's ties, so a point can be added where it is needed.
 */
export function ReferencePointForm({
  siteId,
  point,
  onDone,
  onSaved,
  addPoint,
}: {
  siteId: string;
  point?: ReferencePointResponse;
  onDone: () => void;
  /** The point as stored (a new one with its id). */
  onSaved?: (point: ReferencePointResponse) => void;
  /**
   * Adds a new point instead of the site's own request: a job's ties pass the job's writer, which keeps
   * the point on the device with no signal (under an id of the device) and sends it before the ties
   * made to it. Resolves the point (`isKept`: on this device only, for now), or undefined when the
   * job's conflict dialog took over.
   */
  addPoint?: (input: CreateReferencePointInput) => Promise<{ point: ReferencePointResponse; isKept: boolean } | undefined>;
}) {
  const styles = useStyles();
  const notify = useNotify();
  const create = useCreateReferencePoint();
  const update = useUpdateReferencePoint();
  const conflict = useSiteConflict();
  const [units] = useUnitPreferences();
  const [label, setLabel] = useState(point?.label ?? '');
  const [x, setX] = useState(point ? lengthInputValue(point.x, units.length, 'long') : '');
  const [y, setY] = useState(point ? lengthInputValue(point.y, units.length, 'long') : '');
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const [isAdding, setIsAdding] = useState(false);

  // Coordinates may be negative (west or south of the origin): parse the size, keep the sign.
  const coordinate = (value: string) => {
    const isNegative = value.trim().startsWith('-');
    const parsed = parseLength(value.trim().replace(/^-/, ''), units.length, 'long');
    return parsed.ok ? (isNegative ? -parsed.metres : parsed.metres) : undefined;
  };

  const submit = (event?: FormEvent) => {
    event?.preventDefault();
    const parsed = CreateReferencePointSchema.safeParse({ label, x: coordinate(x), y: coordinate(y) });
    if (!parsed.success) {
      setErrors(fieldErrorsFromZod<Field>(parsed.error));
      return;
    }
    const onSuccess = (saved: ReferencePointResponse, isKept = false) => {
      if (isKept) notify.success('Kept on this device', `"${parsed.data.label}" is added to the site as soon as the phone is back online.`);
      else notify.success(point ? 'Reference point saved' : 'Reference point added', parsed.data.label);
      onSaved?.(saved);
      onDone();
    };
    const onError = (error: unknown) => {
      if (conflict.handle(error, point ? `changing “${point.label}”` : `adding “${parsed.data.label}”`, () => submit())) return;
      const found = fieldErrorsFromApi<Field>(error);
      if (Object.keys(found).length === 0) notify.error('Could not save the point', describeRequestError(error));
      setErrors(found);
    };
    if (!point && addPoint) {
      setIsAdding(true);
      addPoint(parsed.data).then(
        (added) => {
          setIsAdding(false);
          if (added) onSuccess(added.point, added.isKept);
          else onDone();
        },
        (error: unknown) => {
          setIsAdding(false);
          onError(error);
        },
      );
      return;
    }
    const outcome = { onSuccess: (saved: ReferencePointResponse) => onSuccess(saved), onError };
    if (point) update.mutate({ siteId, pointId: point.id, input: parsed.data }, outcome);
    else create.mutate({ siteId, input: parsed.data }, outcome);
  };

  return (
    <form className={styles.form} onSubmit={submit} noValidate aria-label={point ? `Change ${point.label}` : 'New reference point'}>
      <Field label="Name" required validationMessage={errors.label}>
        <Input className={styles.control} value={label} placeholder="North-east house corner" onChange={(_e, d) => setLabel(d.value)} />
      </Field>
      <Field label={`x (east, ${units.length === 'metric' ? 'm' : 'ft'})`} required validationMessage={errors.x}>
        <Input className={styles.control} inputMode="decimal" value={x} onChange={(_e, d) => setX(d.value)} />
      </Field>
      <Field label={`y (north, ${units.length === 'metric' ? 'm' : 'ft'})`} required validationMessage={errors.y}>
        <Input className={styles.control} inputMode="decimal" value={y} onChange={(_e, d) => setY(d.value)} />
      </Field>
      <div className={styles.actions}>
        <Button type="submit" appearance="primary" className={styles.control} disabled={create.isPending || update.isPending || isAdding}>
          Save point
        </Button>
        <Button className={styles.control} onClick={onDone}>
          Cancel
        </Button>
      </div>
      {conflict.dialog}
    </form>
  );
}
