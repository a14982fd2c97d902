import { Button, Card, makeStyles, MessageBar, MessageBarBody, Spinner, Switch, Text, tokens } from '@fluentui/react-components';
import { ArrowDownload20Regular } from '@fluentui/react-icons';
import { useCallback, useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { JobAsBuiltResponse } from '@domain/jobs/job.schema';
import {
  drawJobDepthProfile,
  drawJobSchematic,
  drawJobSitePlan,
  type JobDrawingInput,
  jobTitleBlock,
  planImageForDrawing,
  SITE_PLAN_LAYER_LABELS,
  SITE_PLAN_LAYER_NAMES,
  type SitePlanLayerName,
} from '@drawings/job-drawings';

import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { useNotify } from '../../../components/notify';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { useDateStyle } from '../../../lib/use-date-style';
import { useDownloadDepthProfile } from '../api/download-depth-profile';
import { useDownloadSchematic } from '../api/download-schematic';
import { useDownloadSitePlan } from '../api/download-site-plan';
import { usePlanImage } from '../api/get-plan-image';
import { createBrowserSvgCanvas } from '../utils/browser-svg-canvas';

import { DrawingFrame } from './drawing-frame';

const useStyles = makeStyles({
  page: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXL, minWidth: 0 },
  card: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM, padding: tokens.spacingHorizontalL, minWidth: 0 },
  cardHeader: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: tokens.spacingHorizontalM },
  heading: { margin: 0 },
  layers: {
    display: 'flex',
    flexWrap: 'wrap',
    columnGap: tokens.spacingHorizontalL,
    rowGap: tokens.spacingVerticalXS,
    border: 'none',
    margin: 0,
    padding: 0,
  },
  profiles: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalL,
    '@media (min-width: 720px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))' },
  },
  profile: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS, minWidth: 0, margin: 0 },
  /** A 44 px tall touch target, still reading as a link in the line of text. */
  link: { color: tokens.colorBrandForegroundLink, display: 'inline-flex', alignItems: 'center', minHeight: '44px' },
  /** Touch targets at least 44 px (WCAG 2.5.5), also on a phone. */
  touch: { minHeight: '44px', minWidth: '44px' },
  muted: { color: tokens.colorNeutralForeground2 },
});

type JobDrawingsProps = { data: JobAsBuiltResponse };

/** Runs that get a depth profile: buried runs with readings (as in the packet). */
function profileRuns(data: JobAsBuiltResponse) {
  return data.asBuilt.runs.filter((run) => run.method !== 'indoor' && (run.depthReadings?.length ?? 0) > 0);
}

/**
 * The job's drawings as the packet will print them — site plan, wiring schematic, depth profiles —
 * drawn in the browser from the as-built the workspace already has, by the same code as the server.
 */
export function JobDrawings({ data }: JobDrawingsProps) {
  const styles = useStyles();
  const { job, asBuilt, analysis } = data;
  const [{ length: units }] = useUnitPreferences();
  const [layersOff, setLayersOff] = useState<readonly SitePlanLayerName[]>([]);
  const planImage = usePlanImage(job.site.id);
  const downloadSitePlan = useDownloadSitePlan();
  const downloadSchematic = useDownloadSchematic();
  const downloadDepthProfile = useDownloadDepthProfile();
  const isDownloading = downloadSitePlan.isPending || downloadSchematic.isPending || downloadDepthProfile.isPending;
  const notify = useNotify();

  // The legend is spelled as the company's packet spells it (en-US "color", en-GB "colour").
  const locale = useDateStyle().locale;
  const input = useMemo<JobDrawingInput>(
    () => ({ asBuilt, analysis, createCanvas: createBrowserSvgCanvas, units, locale: locale ?? null }),
    [asBuilt, analysis, units, locale],
  );
  const titleBlock = useMemo(
    () => jobTitleBlock({ jobTitle: job.title, siteLabel: job.site.label, place: job.site.city, revision: job.revision }),
    [job.title, job.site.label, job.site.city, job.revision],
  );
  const planImageOption = useMemo(() => (planImage.data ? planImageForDrawing(planImage.data) : undefined), [planImage.data]);
  const drawPlan = useCallback(
    () => drawJobSitePlan(input, { paper: 'letter', titleBlock, layersOff, ...(planImageOption ? { planImage: planImageOption } : {}) }),
    [input, titleBlock, layersOff, planImageOption],
  );
  const drawSchematic = useCallback(() => drawJobSchematic(input), [input]);
  const runs = profileRuns(data);

  const whenFailed = { onError: (error: Error) => notify.error('The drawing could not be downloaded', error.message) };
  const toggleLayer = (name: SitePlanLayerName, isOn: boolean) =>
    setLayersOff((current) => (isOn ? current.filter((n) => n !== name) : [...current, name]));

  return (
    <div className={styles.page}>
      <PageHeader
        title={`Drawings: ${job.title}`}
        description={
          <span>
            <Link to={paths.job.getHref(job.id)} className={styles.link}>
              Back to the job
            </Link>{' '}
            · {job.site.label}, {job.site.city} · Revision {job.revision}
          </span>
        }
      />
      <Text className={styles.muted}>
        Drawn from the record as entered. They show what was recorded, not that the work meets any code; positions are as
        taped, so hand-dig to confirm before excavating.
      </Text>

      <Card className={styles.card}>
        <div className={styles.cardHeader}>
          <Text as="h3" size={500} weight="semibold" className={styles.heading}>
            Site plan
          </Text>
          <Button
            className={styles.touch}
            icon={<ArrowDownload20Regular />}
            onClick={() => downloadSitePlan.mutate({ jobId: job.id, units, layersOff, fileName: 'site-plan.svg' }, whenFailed)}
            disabled={isDownloading}
          >
            Download site plan (SVG)
          </Button>
        </div>
        <fieldset className={styles.layers}>
          <legend className={styles.muted}>Show on the plan</legend>
          {SITE_PLAN_LAYER_NAMES.map((name) => (
            <Switch
              key={name}
              className={styles.touch}
              label={SITE_PLAN_LAYER_LABELS[name]}
              checked={!layersOff.includes(name)}
              onChange={(_event, value) => toggleLayer(name, value.checked)}
            />
          ))}
        </fieldset>
        {planImage.isError && (
          <MessageBar intent="warning">
            <MessageBarBody>The site’s plan image could not be loaded; the plan is drawn without it.</MessageBarBody>
          </MessageBar>
        )}
        {planImage.isPending ? <Spinner size="small" label="Loading the site’s plan image…" /> : <DrawingFrame label="Site plan" draw={drawPlan} isWide />}
      </Card>

      <Card className={styles.card}>
        <div className={styles.cardHeader}>
          <Text as="h3" size={500} weight="semibold" className={styles.heading}>
            Wiring schematic
          </Text>
          <Button className={styles.touch} icon={<ArrowDownload20Regular />} onClick={() => downloadSchematic.mutate({ jobId: job.id, units, fileName: 'schematic.svg' }, whenFailed)} disabled={isDownloading}>
            Download schematic (SVG)
          </Button>
        </div>
        <DrawingFrame label="Wiring schematic" draw={drawSchematic} isWide />
      </Card>

      <Card className={styles.card}>
        <Text as="h3" size={500} weight="semibold" className={styles.heading}>
          Depth profiles
        </Text>
        {runs.length === 0 ? (
          <Text className={styles.muted}>No buried run has depth readings yet.</Text>
        ) : (
          <div className={styles.profiles}>
            {runs.map((run) => (
              <DepthProfile
                key={run.id}
                label={run.label}
                runId={run.id}
                input={input}
                onDownload={() =>
                  downloadDepthProfile.mutate(
                    { jobId: job.id, runId: run.id, units, fileName: `depth-profile-${run.label.replace(/[^A-Za-z0-9]+/g, '-')}.svg` },
                    whenFailed,
                  )
                }
                isDownloading={isDownloading}
              />
            ))}
          </div>
        )}
      </Card>
    </div>
  );
}

type DepthProfileProps = {
  label: string;
  runId: string;
  input: JobDrawingInput;
  onDownload: () => void;
  isDownloading: boolean;
};

function DepthProfile({ label, runId, input, onDownload, isDownloading }: DepthProfileProps) {
  const styles = useStyles();
  const draw = useCallback(() => drawJobDepthProfile(input, runId), [input, runId]);
  return (
    <figure className={styles.profile}>
      <div className={styles.cardHeader}>
        <figcaption>
          <Text weight="semibold">{label}</Text>
        </figcaption>
        <Button className={styles.touch} size="small" appearance="subtle" icon={<ArrowDownload20Regular />} onClick={onDownload} disabled={isDownloading} aria-label={`Download the depth profile of ${label} (SVG)`}>
          SVG
        </Button>
      </div>
      <DrawingFrame label={`Depth profile of ${label}`} draw={draw} />
    </figure>
  );
}
