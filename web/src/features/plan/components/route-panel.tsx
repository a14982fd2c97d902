import { Button, Field, Select, Spinner, Text } from '@fluentui/react-components';
import { ArrowUndo24Regular, Checkmark24Regular, Delete24Regular, MyLocation24Regular, Pen24Regular } from '@fluentui/react-icons';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';
import { polylineLengthM } from '@domain/geometry/polyline';

import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

import { usePanelStyles } from './panel-styles';

export type RouteMode = 'draw' | 'edit';

/** "Use my position" on the route: add the next point (drawing) or move the picked one (changing). */
export type RoutePhonePosition = {
  action: 'add' | 'move';
  /** Moving needs a picked point. */
  canUse: boolean;
  isWaiting: boolean;
  /** Why the phone gave no position. */
  error: string | undefined;
  onUse: () => void;
};

type RoutePanelProps = {
  asBuilt: AsBuilt;
  runId: string;
  onRunChange: (runId: string) => void;
  mode: RouteMode;
  points: readonly PlanPoint[];
  selectedIndex: number | undefined;
  hasDraft: boolean;
  /** The points placed at a phone's GPS fix (1-based), with the fix's accuracy radius in metres. */
  gpsPoints: readonly { pointNumber: number; accuracyM: number }[];
  isSaving: boolean;
  onUndo: () => void;
  onDeletePoint: () => void;
  onRedraw: () => void;
  onContinue: () => void;
  onSave: () => void;
  onDiscard: () => void;
  /** Absent where the site has no GPS origin. */
  phonePosition?: RoutePhonePosition;
};

function PhonePosition({ phone, isSaving }: { phone: RoutePhonePosition; isSaving: boolean }) {
  const styles = usePanelStyles();
  return (
    <>
      <div className={styles.actions}>
        <Button
          className={styles.button}
          icon={phone.isWaiting ? <Spinner size="tiny" /> : <MyLocation24Regular />}
          disabled={!phone.canUse || phone.isWaiting || isSaving}
          onClick={phone.onUse}
        >
          {phone.action === 'add' ? 'Add a point at my position' : 'Move the picked point to my position'}
        </Button>
      </div>
      {!phone.canUse && <Text className={styles.muted}>Tap a point of the route first, then stand where that bend is.</Text>}
      {phone.error && (
        <Text className={styles.warning} role="alert">
          {phone.error}
        </Text>
      )}
    </>
  );
}

/** Choose a run, then draw its route point by point, or change a drawn one. */
export function RoutePanel(props: RoutePanelProps) {
  const { asBuilt, runId, onRunChange, mode, points, selectedIndex, hasDraft, isSaving } = props;
  const styles = usePanelStyles();
  const [units] = useUnitPreferences();
  const run = asBuilt.runs.find((candidate) => candidate.id === runId);
  const length = polylineLengthM(points);
  return (
    <section className={styles.panel} aria-label="Route">
      <Field label="Run">
        <Select className={styles.control} value={runId} onChange={(_e, d) => onRunChange(d.value)}>
          <option value="">Choose a run</option>
          {asBuilt.runs.map((candidate) => (
            <option key={candidate.id} value={candidate.id}>
              {candidate.label}
              {candidate.route ? '' : ' (no route yet)'}
            </option>
          ))}
        </Select>
      </Field>
      {run && (
        <>
          <Text>
            {points.length === 0
              ? 'No points yet.'
              : `${points.length} point${points.length === 1 ? '' : 's'}, ${formatLength(length, units.length, 'long')} drawn`}
            {` · measured ${formatLength(run.measuredLengthM, units.length, 'long')}`}
          </Text>
          {hasDraft && <Text className={styles.warning}>Not saved yet: the route is kept on this device until you save it.</Text>}
          <div className={styles.actions}>
            {mode === 'draw' ? (
              <>
                <Button className={styles.button} icon={<ArrowUndo24Regular />} disabled={points.length === 0 || isSaving} onClick={props.onUndo}>
                  Undo last point
                </Button>
                <Button
                  appearance="primary"
                  className={styles.button}
                  icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />}
                  disabled={points.length < 2 || isSaving}
                  onClick={props.onSave}
                >
                  Finish route
                </Button>
              </>
            ) : (
              <>
                <Button className={styles.button} icon={<Delete24Regular />} disabled={selectedIndex === undefined || points.length <= 2 || isSaving} onClick={props.onDeletePoint}>
                  Delete point
                </Button>
                <Button className={styles.button} icon={<Pen24Regular />} disabled={isSaving} onClick={props.onContinue}>
                  Add points at the end
                </Button>
                <Button className={styles.button} disabled={isSaving} onClick={props.onRedraw}>
                  Draw again
                </Button>
                <Button
                  appearance="primary"
                  className={styles.button}
                  icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />}
                  disabled={!hasDraft || points.length < 2 || isSaving}
                  onClick={props.onSave}
                >
                  Save route
                </Button>
              </>
            )}
            {hasDraft && (
              <Button appearance="subtle" className={styles.button} disabled={isSaving} onClick={props.onDiscard}>
                Discard changes
              </Button>
            )}
          </div>
          {props.phonePosition && <PhonePosition phone={props.phonePosition} isSaving={isSaving} />}
          {props.gpsPoints.length > 0 && (
            <Text className={styles.warning} aria-live="polite">
              {props.gpsPoints
                .map((p) => `Point ${p.pointNumber} is a phone’s position, good to about ±${formatLength(p.accuracyM, units.length, 'long')}.`)
                .join(' ')}{' '}
              A phone fix is several times weaker than taped ties: tape the bends where you can.
            </Text>
          )}
        </>
      )}
    </section>
  );
}
