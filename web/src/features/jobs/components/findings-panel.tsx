import { Button, makeStyles, mergeClasses, Text, tokens } from '@fluentui/react-components';
import { CheckmarkCircle20Regular, ErrorCircle20Filled, Info20Regular, Warning20Filled } from '@fluentui/react-icons';
import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import { FINDING_SEVERITY_LABELS, findingText, type FindingSeverity } from '@domain/analysis/finding';
import { findingScope, findingScopeText } from '@domain/analysis/finding-scope';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { SiteRecordInfo } from '@domain/jobs/job.schema';
import type { ReactElement } from 'react';

import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useWorkspaceFocus } from '../hooks/workspace-focus';
import { SECTION_LABELS, targetOfPath } from '../utils/finding-target';

import { ChannelSummaries } from './channel-summaries';

const useStyles = makeStyles({
  root: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  heading: { margin: 0 },
  counts: { color: tokens.colorNeutralForeground2 },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  finding: {
    display: 'grid',
    gridTemplateColumns: 'auto minmax(0, 1fr)',
    columnGap: tokens.spacingHorizontalS,
    rowGap: tokens.spacingVerticalXS,
    padding: tokens.spacingVerticalS,
    borderInlineStartWidth: tokens.strokeWidthThickest,
    borderInlineStartStyle: 'solid',
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  critical: { borderInlineStartColor: tokens.colorPaletteRedBorder2 },
  warning: { borderInlineStartColor: tokens.colorPaletteDarkOrangeBorder2 },
  info: { borderInlineStartColor: tokens.colorNeutralStroke1 },
  iconCritical: { color: tokens.colorPaletteRedForeground1 },
  iconWarning: { color: tokens.colorPaletteDarkOrangeForeground1 },
  iconInfo: { color: tokens.colorNeutralForeground2 },
  body: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, minWidth: 0 },
  message: { overflowWrap: 'anywhere' },
  scope: { overflowWrap: 'anywhere', color: tokens.colorNeutralForeground2 },
  link: { alignSelf: 'flex-start', minHeight: '44px', paddingInline: 0 },
  clear: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, color: tokens.colorPaletteGreenForeground1 },
});

// Words as well as icons and colours: a severity must read the same in grey-scale and to a screen reader.

type FindingsPanelProps = {
  analysis: AsBuiltAnalysis;
  asBuilt: AsBuilt;
  /** Provenance of the site's records (issue 21): each finding says whether it is about this job's work or records already in the ground. */
  siteRecords?: Readonly<Record<string, SiteRecordInfo>>;
  headingId?: string;
};

/**
 * Everything the analysis found, most serious first, each with a link to the field it is about, and a
 * line per amplifier channel (load, worst level drop, share dissipated in the cable).
 */
export function FindingsPanel({ analysis, asBuilt, siteRecords, headingId = 'findings-heading' }: FindingsPanelProps) {
  const styles = useStyles();
  const { focus } = useWorkspaceFocus();
  const [units] = useUnitPreferences();
  const { critical, warning, info } = analysis.summary;

  const icon = (severity: FindingSeverity): ReactElement =>
    severity === 'critical' ? (
      <ErrorCircle20Filled className={styles.iconCritical} aria-hidden />
    ) : severity === 'warning' ? (
      <Warning20Filled className={styles.iconWarning} aria-hidden />
    ) : (
      <Info20Regular className={styles.iconInfo} aria-hidden />
    );

  return (
    <section className={styles.root} aria-labelledby={headingId}>
      <Text as="h3" id={headingId} size={500} weight="semibold" className={styles.heading}>
        Findings
      </Text>
      <Text className={styles.counts} aria-live="polite">
        {analysis.findings.length === 0
          ? 'Nothing to look at.'
          : `${critical} must fix · ${warning} to check · ${info} ${info === 1 ? 'note' : 'notes'}`}
      </Text>
      <ChannelSummaries analysis={analysis} asBuilt={asBuilt} />
      {analysis.findings.length === 0 ? (
        <Text className={styles.clear}>
          <CheckmarkCircle20Regular aria-hidden /> The record passes every check Loamline makes.
        </Text>
      ) : (
        <ul className={styles.list} aria-label="Findings">
          {analysis.findings.map((finding, i) => {
            const target = targetOfPath(finding.path, asBuilt);
            const scope = findingScope(finding, asBuilt, siteRecords);
            return (
              <li key={`${finding.code}-${finding.path.join('.')}-${i}`} className={mergeClasses(styles.finding, styles[finding.severity])}>
                {icon(finding.severity)}
                <div className={styles.body}>
                  <Text weight="semibold">{FINDING_SEVERITY_LABELS[finding.severity]}</Text>
                  <Text className={styles.message}>{findingText(finding, units.length)}</Text>
                  {scope && <Text className={styles.scope}>{findingScopeText(scope)}</Text>}
                  {target && (
                    <Button appearance="transparent" className={styles.link} onClick={() => focus(target)}>
                      {target.recordId ? 'Show the field' : `Go to ${SECTION_LABELS[target.section]}`}
                    </Button>
                  )}
                </div>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );

}
