import { Button, Text } from '@fluentui/react-components';
import { Open20Regular, Pen24Regular, TargetArrow24Regular } from '@fluentui/react-icons';
import { Link } from 'react-router';
import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import { findingText } from '@domain/analysis/finding';

import { paths } from '../../../config/paths';
import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { gpsBendsText, ITEM_KIND_LABELS, METHOD_LABELS } from '../../job-record';

import { usePanelStyles } from './panel-styles';

export type PlanSelection = { type: 'item' | 'reference' | 'run'; id: string };

type SelectionCardProps = {
  jobId: string;
  asBuilt: AsBuilt;
  analysis: AsBuiltAnalysis;
  selection: PlanSelection | undefined;
  canRecord: boolean;
  onPlaceByTies: (itemId: string) => void;
  onDrawRoute: (runId: string) => void;
};

const SOURCE_LABELS = { ties: 'from ties', manual: 'placed by hand', gps: 'from a phone GPS fix' } as const;

/** A small card about what was tapped, with a way to its form in the job workspace. */
export function SelectionCard({ jobId, asBuilt, analysis, selection, canRecord, onPlaceByTies, onDrawRoute }: SelectionCardProps) {
  const styles = usePanelStyles();
  const [units] = useUnitPreferences();
  const length = (m: number) => formatLength(m, units.length, 'long');
  const unplaced = asBuilt.items.filter((item) => !analysis.positions.some((p) => p.itemId === item.id));

  if (!selection) {
    return (
      <section className={styles.panel} aria-label="Selection">
        <Text className={styles.muted}>Tap an item, run or reference point to see it.</Text>
        {unplaced.length > 0 && (
          <Text>
            Not on the plan yet: {unplaced.map((item) => item.label).join(', ')}. Use <strong>Ties</strong> to place them.
          </Text>
        )}
      </section>
    );
  }
  if (selection.type === 'item') {
    const item = asBuilt.items.find((candidate) => candidate.id === selection.id);
    if (!item) return null;
    const position = analysis.positions.find((p) => p.itemId === item.id);
    const findings = analysis.findings.filter((f) => f.itemId === item.id && f.code.startsWith('POSITION_'));
    return (
      <section className={styles.panel} aria-label={`Item ${item.label}`}>
        <Text as="h3" weight="semibold" size={400} className={styles.title}>
          {item.label}
        </Text>
        <dl className={styles.facts}>
          <dt className={styles.factName}>Kind</dt>
          <dd className={styles.factValue}>{ITEM_KIND_LABELS[item.kind]}</dd>
          <dt className={styles.factName}>Position</dt>
          <dd className={styles.factValue}>
            {position
              ? `x ${length(position.x)}, y ${length(position.y)}, ${SOURCE_LABELS[position.source]}${position.accuracyM !== null && Number.isFinite(position.accuracyM) ? `, ±${formatLength(position.accuracyM, units.length, 'short')}` : ''}`
              : 'none yet'}
          </dd>
        </dl>
        {findings.map((finding) => (
          <Text key={finding.code} className={styles.warning}>
            {findingText(finding, units.length)}
          </Text>
        ))}
        {(item.ties?.length ?? 0) > 0 && canRecord && <Text className={styles.muted}>Placed from ties: change the ties to move it.</Text>}
        <div className={styles.actions}>
          {canRecord && item.kind !== 'amplifier' && (
            <Button className={styles.button} icon={<TargetArrow24Regular />} onClick={() => onPlaceByTies(item.id)}>
              Place by ties
            </Button>
          )}
          <Link to={paths.job.getHref(jobId, item.kind === 'wall_entry' ? 'walls' : 'equipment')} className={styles.linkButton}>
            <Open20Regular aria-hidden />
            Open in the job
          </Link>
        </div>
      </section>
    );
  }
  if (selection.type === 'run') {
    const run = asBuilt.runs.find((candidate) => candidate.id === selection.id);
    const result = analysis.runs.find((r) => r.runId === selection.id);
    if (!run) return null;
    const gpsText = gpsBendsText(run.route, units.length);
    return (
      <section className={styles.panel} aria-label={`Run ${run.label}`}>
        <Text as="h3" weight="semibold" size={400} className={styles.title}>
          {run.label}
        </Text>
        <dl className={styles.facts}>
          <dt className={styles.factName}>Laid</dt>
          <dd className={styles.factValue}>
            {METHOD_LABELS[run.method]}
            {run.isSpare ? ', spare' : ''}
            {run.isAbandoned ? ', abandoned' : ''}
          </dd>
          <dt className={styles.factName}>Measured</dt>
          <dd className={styles.factValue}>{length(run.measuredLengthM)}</dd>
          <dt className={styles.factName}>Drawn</dt>
          <dd className={styles.factValue}>{result?.routeLengthM != null ? length(result.routeLengthM) : 'no route yet'}</dd>
          {gpsText && (
            <>
              <dt className={styles.factName}>From a phone</dt>
              <dd className={styles.factValue}>{gpsText}</dd>
            </>
          )}
        </dl>
        {result?.lengthCheck?.isMismatch && (
          <Text className={styles.warning}>
            The drawn route and the measured length differ by {length(Math.abs(result.lengthCheck.differenceM))} (more than the {length(result.lengthCheck.allowedM)} allowed).
          </Text>
        )}
        <div className={styles.actions}>
          {canRecord && (
            <Button className={styles.button} icon={<Pen24Regular />} onClick={() => onDrawRoute(run.id)}>
              {run.route ? 'Change the route' : 'Draw the route'}
            </Button>
          )}
          <Link to={paths.job.getHref(jobId)} className={styles.linkButton}>
            <Open20Regular aria-hidden />
            Open in the job
          </Link>
        </div>
      </section>
    );
  }
  const point = asBuilt.referencePoints.find((candidate) => candidate.id === selection.id);
  if (!point) return null;
  return (
    <section className={styles.panel} aria-label={`Reference point ${point.label}`}>
      <Text as="h3" weight="semibold" size={400} className={styles.title}>
        {point.label}
      </Text>
      <Text>
        Reference point at x {length(point.x)}, y {length(point.y)}. Ties are taped from it.
      </Text>
    </section>
  );
}
