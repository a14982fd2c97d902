import { Button, Dialog, DialogBody, DialogContent, DialogSurface, DialogTitle, Field, makeStyles, Radio, RadioGroup, Select, Text, tokens } from '@fluentui/react-components';
import { Add20Regular, Delete20Regular, Location20Regular, Pin20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import type { ReferencePoint } from '@domain/as-built/item.schema';
import { solvePositionFromTies, type TieObservation, type TieSolution } from '@domain/geometry/ties';
import { type CreateReferencePointInput, type ReferencePointResponse, ReferencePointResponseSchema } from '@domain/sites/site.schema';

import { formatLength, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { ReferencePointForm } from '../../sites';
import { useJobWriter } from '../hooks/job-writer';
import { fieldDomId } from '../utils/finding-target';

import { useFormStyles } from '../../../components/form-styles';
import { LengthInput } from './length-input';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  // The point on its own row on a phone, so its full name shows ("Choose a point", "NE house corner").
  tie: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) auto',
    gap: tokens.spacingHorizontalS,
    alignItems: 'end',
    '& > :first-child': { gridColumn: '1 / -1' },
    '@media (min-width: 640px)': { gridTemplateColumns: 'minmax(0, 1.2fr) minmax(0, 1fr) auto', '& > :first-child': { gridColumn: 'auto' } },
  },
  solution: {
    display: 'flex',
    alignItems: 'flex-start',
    gap: tokens.spacingHorizontalS,
    padding: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  weak: { color: tokens.colorPaletteDarkOrangeForeground1 },
});

export type TieDraft = { referencePointId: string; distance: string };

/**
 * The site's new-point form, saving through the job's writer (issue 17): with no signal the point waits
 * on the device with the job's other writes, is offered for ties at once under the id the device gave
 * it, and goes to the server before the item taped from it.
 */
function JobReferencePointForm(props: { siteId: string; onDone: () => void; onSaved: (point: ReferencePointResponse) => void }) {
  const writer = useJobWriter();
  const addPoint = async (input: CreateReferencePointInput): Promise<{ point: ReferencePointResponse; isKept: boolean } | undefined> => {
    const result = await writer.saveWithResult({
      endpoint: 'createReferencePoint',
      params: { siteId: props.siteId },
      body: input,
      label: `Reference point "${input.label}"`,
    });
    if (result.outcome === 'saved' && result.response) return { point: ReferencePointResponseSchema.parse(result.response), isKept: false };
    if (result.outcome === 'queued' && result.localId) {
      return { point: { id: result.localId, label: input.label, x: input.x, y: input.y, notes: input.notes ?? null }, isKept: true };
    }
    return undefined;
  };
  return <ReferencePointForm {...props} addPoint={addPoint} />;
}

type TiesEditorProps = {
  recordId: string;
  referencePoints: readonly ReferencePoint[];
  ties: TieDraft[];
  sideHint: '' | 'left' | 'right';
  onChange: (ties: TieDraft[], sideHint: '' | 'left' | 'right') => void;
  error?: string;
  /** The job's site: with it, a missing reference point can be added from here. */
  siteId?: string;
};

/**
 * Where the typed ties put the item (the same solver the analysis uses), or undefined with fewer than
 * two readable ties.
 */
export function solveTieDrafts(
  ties: readonly TieDraft[],
  referencePoints: readonly ReferencePoint[],
  sideHint: '' | 'left' | 'right',
  lengthSystem: 'imperial' | 'metric',
): TieSolution | undefined {
  const observations: TieObservation[] = [];
  for (const tie of ties) {
    const point = referencePoints.find((candidate) => candidate.id === tie.referencePointId);
    const distance = parseLength(tie.distance, lengthSystem, 'long');
    if (point && distance.ok && distance.metres > 0) observations.push({ x: point.x, y: point.y, distanceM: distance.metres });
  }
  return observations.length >= 2 ? solvePositionFromTies(observations, { sideHint: sideHint || undefined }) : undefined;
}

/**
 * Ties from reference points: each a point and a taped distance. Shows at once where they put the item
 * and how well (the same solver the analysis uses), before anything is saved.
 */
export function TiesEditor({ recordId, referencePoints, ties, sideHint, onChange, error, siteId }: TiesEditorProps) {
  const styles = useStyles();
  const formStyles = useFormStyles();
  const [units] = useUnitPreferences();
  const [isAddingPoint, setIsAddingPoint] = useState(false);

  // The new point's form is a form of its own, shown in a dialog (a portal): its submit must not reach
  // the item form around this editor through React's event tree.
  const newPoint = siteId ? (
    <>
      <Button className={formStyles.button} icon={<Pin20Regular />} onClick={() => setIsAddingPoint(true)}>
        New reference point
      </Button>
      <Dialog open={isAddingPoint} onOpenChange={(_event, data) => setIsAddingPoint(data.open)}>
        <DialogSurface onSubmit={(event) => event.stopPropagation()}>
          <DialogBody>
            <DialogTitle>New reference point</DialogTitle>
            <DialogContent>
              <JobReferencePointForm
                siteId={siteId}
                onDone={() => setIsAddingPoint(false)}
                onSaved={(point) => {
                  // Tape from it at once: it fills the first tie without a point, or a new one.
                  const empty = ties.findIndex((tie) => tie.referencePointId === '');
                  onChange(
                    empty === -1 ? [...ties, { referencePointId: point.id, distance: '' }] : ties.map((tie, i) => (i === empty ? { ...tie, referencePointId: point.id } : tie)),
                    sideHint,
                  );
                }}
              />
            </DialogContent>
          </DialogBody>
        </DialogSurface>
      </Dialog>
    </>
  ) : null;

  const solution = solveTieDrafts(ties, referencePoints, sideHint, units.length);
  const first = referencePoints.find((p) => p.id === ties[0]?.referencePointId)?.label ?? 'the first point';
  const second = referencePoints.find((p) => p.id === ties[1]?.referencePointId)?.label ?? 'the second point';
  // How far apart the first two chosen points are: two ties longer in sum than this can meet.
  const pointA = referencePoints.find((p) => p.id === ties[0]?.referencePointId);
  const pointB = referencePoints.find((p) => p.id === ties[1]?.referencePointId);
  const baseline = pointA && pointB && pointA.id !== pointB.id ? Math.hypot(pointB.x - pointA.x, pointB.y - pointA.y) : undefined;

  if (referencePoints.length === 0) {
    return (
      <div className={styles.root}>
        <Text>This site has no reference points yet. Add a house corner or a post, then tape ties from it.</Text>
        <div className={formStyles.actions}>{newPoint}</div>
      </div>
    );
  }

  return (
    <div className={styles.root} id={fieldDomId(recordId, 'ties')} tabIndex={-1}>
      <Text weight="semibold">Ties (taped from reference points)</Text>
      {error && <Text className={styles.weak}>{error}</Text>}
      {ties.map((tie, i) => (
        <div key={i} className={styles.tie}>
          <Field label={`Tie ${i + 1} from`}>
            <Select
              className={formStyles.control}
              value={tie.referencePointId}
              onChange={(_e, d) => onChange(ties.map((t, j) => (j === i ? { ...t, referencePointId: d.value } : t)), sideHint)}
            >
              <option value="">Choose a point</option>
              {referencePoints.map((point) => (
                <option key={point.id} value={point.id}>
                  {point.label}
                </option>
              ))}
            </Select>
          </Field>
          <LengthInput
            id={`${fieldDomId(recordId, 'tie')}-${i}`}
            label="Distance"
            scale="long"
            value={tie.distance}
            onChange={(distance) => onChange(ties.map((t, j) => (j === i ? { ...t, distance } : t)), sideHint)}
          />
          <Button
            appearance="subtle"
            className={formStyles.button}
            icon={<Delete20Regular />}
            aria-label={`Remove tie ${i + 1}`}
            onClick={() => onChange(ties.filter((_t, j) => j !== i), sideHint)}
          />
        </div>
      ))}
      <div className={formStyles.actions}>
        <Button className={formStyles.button} icon={<Add20Regular />} onClick={() => onChange([...ties, { referencePointId: '', distance: '' }], sideHint)}>
          Add a tie
        </Button>
        {newPoint}
      </div>
      {ties.length >= 2 && (
        <Field label={`Standing at ${first} and looking at ${second}, the item is on the`} id={fieldDomId(recordId, 'sideHint')}>
          <RadioGroup layout="horizontal" value={sideHint} onChange={(_e, d) => onChange(ties, d.value as 'left' | 'right')}>
            <Radio className={formStyles.control} value="left" label="Left" />
            <Radio className={formStyles.control} value="right" label="Right" />
          </RadioGroup>
        </Field>
      )}
      {baseline !== undefined && (
        <Text>
          {pointA!.label} to {pointB!.label}: {formatLength(baseline, units.length, 'long')} apart.
        </Text>
      )}
      {solution && (
        <div className={styles.solution} aria-live="polite">
          <Location20Regular aria-hidden />
          {solution.ok ? (
            <Text className={solution.isWeak ? styles.weak : undefined}>
              Placed at x {formatLength(solution.x, units.length, 'long')}, y {formatLength(solution.y, units.length, 'long')}, good to about ±
              {Number.isFinite(solution.accuracyM) ? formatLength(solution.accuracyM, units.length, 'short') : '?'}
              {solution.isWeak ? '. The ties meet at a shallow angle: add one from a point off to the side.' : '.'}
            </Text>
          ) : (
            <Text className={styles.weak}>Cannot place it yet: {solution.message}.</Text>
          )}
        </div>
      )}
    </div>
  );
}
