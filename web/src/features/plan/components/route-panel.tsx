import { Button, Field, Select, Spinner, Text } from '@fluentui/react-components';
import { ArrowUndo24Regular, Checkmark24Regular, Delete24Regular, Pen24Regular } from '@fluentui/react-icons';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';
import { polylineLengthM } from '@domain/geometry/polyline';

import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

import { usePanelStyles } from './panel-styles';

export type RouteMode = 'draw' | 'edit';

type RoutePanelProps = {
  asBuilt: AsBuilt;
  runId: string;
  onRunChange: (runId: string) => void;
  mode: RouteMode;
  points: readonly PlanPoint[];
  selectedIndex: number | undefined;
  hasDraft: boolean;
  isSaving: boolean;
  onUndo: () => void;
  onDeletePoint: () => void;
  onRedraw: () => void;
  onContinue: () => void;
  onSave: () => void;
  onDiscard: () => void;
};

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
        </>
      )}
    </section>
  );
}
