import { makeStyles, MessageBar, MessageBarBody, Text, tokens } from '@fluentui/react-components';
import { ArrowLeft24Regular } from '@fluentui/react-icons';
import { useMemo, useState } from 'react';
import { Link } from 'react-router';
import type { PlanPoint } from '@domain/as-built/common.schema';
import type { Role } from '@domain/auth/roles';

import { useNotify } from '../../../components/notify';
import { paths } from '../../../config/paths';
import { describeRequestError } from '../../../lib/form-errors';
import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { gpsBends, type JobAsBuiltResponse } from '../../job-record';
import { SaveStateBar } from '../../jobs';
import { useJobWriter } from '../../jobs';
import { jobPermissions } from '../../jobs';
import type { SiteResponse } from '../../sites';
import { useSiteConflict } from '../../sites';
import { usePlanImageUrl } from '../api/get-plan-image';
import { planImageOf } from '../api/site-plan-image';
import { useCalibrationTool } from '../hooks/use-calibration-tool';
import { useFeatureTool } from '../hooks/use-feature-tool';
import { useNorthTool } from '../hooks/use-north-tool';
import { useReferenceTool } from '../hooks/use-reference-tool';
import { useRouteTool } from '../hooks/use-route-tool';
import { useTiesTool } from '../hooks/use-ties-tool';
import {
  imageToPlan,
  placementOf,
  provisionalPlacement,
  roundPlanPoint,
  snapPoint,
} from '../utils/plan-geometry';
import {
  canAddReferencePoint,
  canChangeSitePlan,
  canUploadPlanImage,
  DEFAULT_PLAN_LAYERS,
  itemBodyWith,
  itemsWithPositionFindings,
  positionsOf,
  routeBadge,
  runPoints,
  runStyleOf,
  type PlanLayers,
} from '../utils/plan-records';

import { CalibratePanel } from './calibrate-panel';
import { LayersMenu } from './layers-menu';
import { NorthPanel } from './north-panel';
import { PlanCanvas, type CanvasModel, type PlanHit } from './plan-canvas';
import { PlanToolbar, type PlanTool } from './plan-toolbar';

import { FeaturePanel } from './feature-panel';
import { ReferencePointDialog } from './reference-point-dialog';
import { RoutePanel } from './route-panel';
import { SelectionCard, type PlanSelection } from './selection-card';
import { TiesPanel } from './ties-panel';

const useStyles = makeStyles({
  layout: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalM,
    '@media (min-width: 1024px)': { gridTemplateColumns: 'minmax(0, 1fr) minmax(20rem, 24rem)', columnGap: tokens.spacingHorizontalL, alignItems: 'start' },
  },
  main: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS, minWidth: 0 },
  canvas: { height: '46dvh', minHeight: '320px', '@media (min-width: 1024px)': { height: 'calc(100dvh - 260px)', minHeight: '420px' } },
  side: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM, minWidth: 0 },
  header: { display: 'flex', alignItems: 'center', gap: tokens.spacingHorizontalS, marginBlockEnd: tokens.spacingVerticalM, minWidth: 0 },
  // The job's whole title (on a phone over two lines rather than cut off).
  title: { margin: 0, minWidth: 0, overflowWrap: 'anywhere' },
  back: {
    display: 'inline-flex',
    alignItems: 'center',
    justifyContent: 'center',
    flexShrink: 0,
    minWidth: '48px',
    minHeight: '48px',
    borderRadius: tokens.borderRadiusMedium,
    color: tokens.colorBrandForegroundLink,
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
  },
});

type PlanEditorProps = { data: JobAsBuiltResponse; site: SiteResponse; actor: { id: string; role: Role } };

/** Tap targets are 44 px across; a tap this close to an item or reference point lands on it. */
const SNAP_PX = 22;

/**
 * The job's plan on a phone: pan and zoom, the site-plan image and its scale, reference points, items
 * placed by ties or by hand, run routes drawn by tapping, north, and layers. Job records are saved with
 * the job writer (versioned, kept on the device without a connection); site changes go to the site.
 */
export function PlanEditor({ data, site, actor }: PlanEditorProps) {
  const styles = useStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [units] = useUnitPreferences();
  const { job, asBuilt, analysis } = data;
  const permissions = jobPermissions(actor, job);
  const canRecord = permissions.canRecord;
  // A crew lead changes the site's plan only from an open job they are on (the API's rule, issue 18 §2).
  const isSiteCrew = actor.role !== 'lead' || canRecord;
  const canSite = canChangeSitePlan(actor.role) && isSiteCrew;
  const canUpload = canUploadPlanImage(actor.role) && isSiteCrew;
  const canReference = canAddReferencePoint(actor.role) && isSiteCrew;
  const tools = useMemo<PlanTool[]>(
    () => [
      'select',
      ...(canReference ? (['reference', 'feature'] as const) : []),
      ...(canRecord ? (['route', 'ties'] as const) : []),
      ...(canSite || canUpload ? (['calibrate'] as const) : []),
      ...(canSite ? (['north'] as const) : []),
    ],
    [canRecord, canReference, canSite, canUpload],
  );

  const [tool, setToolState] = useState<PlanTool>('select');
  const [layers, setLayers] = useState<PlanLayers>(DEFAULT_PLAN_LAYERS);
  const [selection, setSelection] = useState<PlanSelection | undefined>();
  const [transformK, setTransformK] = useState(1);
  const [isSaving, setIsSaving] = useState(false);
  /** Said instead of the hint when a tap could not be used. */
  const [tapNotice, setTapNotice] = useState<string | undefined>();

  // Route tool.
  // The point or corner picked on the canvas, by the route and landmark tools.
  const [selectedVertex, setSelectedVertex] = useState<number | undefined>();
  const route = useRouteTool({ jobId: job.id, asBuilt, saveJobWrite: (write, done) => saveJobWrite(write, done), selectedVertex, setSelectedVertex });

  // The ties tool saves through saveJobWrite below (called only after it is defined).
  const ties = useTiesTool({ jobId: job.id, asBuilt, saveJobWrite: (write, done) => saveJobWrite(write, done) });

  // Landmarks (site features): a draft of the one being drawn or changed.
  const siteFeatures = asBuilt.site?.features ?? [];
  // Site writes name the site's version: "someone changed this site first" asks as job writes do.
  const siteConflict = useSiteConflict();
  const north = useNorthTool({ site, siteConflict });
  const reference = useReferenceTool({ site, writer });
  const feature = useFeatureTool({ site, features: siteFeatures, siteConflict, selectedVertex, setSelectedVertex });

  const planImage = planImageOf(site);
  const { href: imageHref, isError: isImageError } = usePlanImageUrl(planImage);
  const placement = planImage ? (site.planCalibration ? placementOf(site.planCalibration) : provisionalPlacement(planImage.widthPx)) : undefined;
  const calibrate = useCalibrationTool({ jobId: job.id, site, planImage, placement, canCalibrate: canSite, canUpload, siteConflict });
  const { calibration } = calibrate;

  const positions = positionsOf(analysis);
  const flagged = itemsWithPositionFindings(analysis);
  const formatLong = (m: number) => formatLength(m, units.length, 'long');

  const setTool = (next: PlanTool) => {
    setToolState(next);
    setTapNotice(undefined);
    setSelectedVertex(undefined);
    calibrate.clearError();
  };

  const startRoute = (runId: string) => {
    route.start(runId);
    setTool('route');
  };
  const startTies = (itemId: string) => {
    ties.start(itemId);
    setTool('ties');
  };

  // ---- What the plan shows -------------------------------------------------------------------
  const model: CanvasModel = {
    features: siteFeatures.map((f) => ({ ...f, isSelected: tool === 'feature' && f.id === feature.draft.featureId })),
    items: asBuilt.items.flatMap((item) => {
      const p = positions.get(item.id);
      if (!p) return [];
      const isSelected = (selection?.type === 'item' && selection.id === item.id) || (tool === 'ties' && item.id === ties.itemId);
      const isDraggable = tool === 'select' && canRecord && (item.ties?.length ?? 0) === 0;
      return [{ id: item.id, kind: item.kind, label: item.label, x: p.x, y: p.y, isSelected, isDraggable, hasFinding: flagged.has(item.id) }];
    }),
    references: layers.references
      ? asBuilt.referencePoints.map((rp) => ({
          ...rp,
          isSelected:
            (selection?.type === 'reference' && selection.id === rp.id) ||
            (tool === 'ties' && ties.ties.some((tie) => tie.referencePointId === rp.id)),
        }))
      : [],
    ties: layers.references
      ? asBuilt.items.flatMap((item) => {
          const p = positions.get(item.id);
          // Every tie at once is a thicket: only those of the item looked at are drawn.
          const isShown = tool === 'select' && selection?.type === 'item' && selection.id === item.id;
          if (!p || !isShown) return [];
          return (item.ties ?? []).flatMap((tie) => {
            const rp = asBuilt.referencePoints.find((candidate) => candidate.id === tie.referencePointId);
            return rp ? [{ from: rp, to: p }] : [];
          });
        })
      : [],
    runs: layers.runs
      ? asBuilt.runs.flatMap((run) => {
          if (!layers.spareAndAbandoned && (run.isSpare === true || run.isAbandoned === true)) return [];
          const drawn = runPoints(run, positions);
          if (!drawn) return [];
          return [
            {
              id: run.id,
              label: run.label,
              style: runStyleOf(run),
              ...drawn,
              isActive: tool === 'route' && run.id === route.runId,
              badge: routeBadge(analysis, run.id, formatLong),
            },
          ];
        })
      : [],
    image:
      planImage && placement && layers.image
        ? { href: imageHref, widthPx: planImage.widthPx, heightPx: planImage.heightPx, placement, isProvisional: !site.planCalibration }
        : undefined,
    draftRoute:
      tool === 'route' && route.run
        ? { points: route.points, selectedIndex: selectedVertex, isEditable: true, canInsert: route.mode === 'edit' }
        : tool === 'feature'
          ? { points: feature.draft.shape === 'polygon' && feature.points.length >= 3 ? [...feature.points, feature.points[0]!] : feature.points, selectedIndex: selectedVertex, isEditable: true, canInsert: false }
          : undefined,
    marks:
      tool === 'calibrate' && placement && canSite
        ? [
            ...(calibration.a ? [{ ...imageToPlan(calibration.a, placement), label: 'A' }] : []),
            ...(calibration.b ? [{ ...imageToPlan(calibration.b, placement), label: 'B' }] : []),
          ]
        : [],
    solution:
      tool === 'ties' && ties.solution?.ok
        ? { x: ties.solution.x, y: ties.solution.y, accuracyM: ties.solution.accuracyM, isWeak: ties.solution.isWeak }
        : undefined,
    gpsBends: layers.runs
      ? asBuilt.runs.flatMap((run) => {
          if (!layers.spareAndAbandoned && (run.isSpare === true || run.isAbandoned === true)) return [];
          const isDrafting = tool === 'route' && run.id === route.runId;
          const points = isDrafting ? route.points : (run.route ?? []);
          return gpsBends(points).map((bend) => {
            const point = points[bend.pointNumber - 1]!;
            return {
              key: `${run.id}:${bend.pointNumber}`,
              x: point.x,
              y: point.y,
              accuracyM: bend.accuracyM,
              label: `Route point ${bend.pointNumber} of ${run.label}: a phone GPS fix, good to about ±${formatLong(bend.accuracyM)}`,
            };
          });
        })
      : [],
    showLabels: layers.labels,
    northAzimuthDeg: tool === 'north' ? north.previewDeg : (site.northAzimuthDeg ?? null),
    lengthSystem: units.length,
  };
  if (tool === 'ties' && layers.references) model.ties.push(...ties.tieLines());

  // ---- Saving --------------------------------------------------------------------------------
  const saveJobWrite = async (write: Parameters<typeof writer.save>[0], done: string) => {
    setIsSaving(true);
    try {
      const outcome = await writer.save(write);
      if (outcome === 'saved') notify.success(done, write.label);
      else if (outcome === 'queued') notify.success('Kept on this device', 'No connection: it is sent as soon as the phone is back online.');
      return outcome;
    } catch (error) {
      notify.error(`Could not save: ${write.label}`, describeRequestError(error));
      return undefined;
    } finally {
      setIsSaving(false);
    }
  };

  const moveItem = async (itemId: string, point: PlanPoint) => {
    const item = asBuilt.items.find((candidate) => candidate.id === itemId);
    if (!item) return;
    await saveJobWrite(
      {
        endpoint: 'replaceItem',
        params: { itemId: item.id },
        body: itemBodyWith(item, { position: { ...roundPlanPoint(point), source: 'manual' } }),
        label: `Position of "${item.label}"`,
      },
      'Moved',
    );
  };

  // ---- Taps and drags ------------------------------------------------------------------------
  // Points snap to items, reference points and the corners of other landmarks.
  const snapTargets = [
    ...model.items,
    ...asBuilt.referencePoints.map((rp) => ({ ...rp })),
    ...siteFeatures.filter((f) => f.id !== feature.draft.featureId).flatMap((f) => f.points.map((p) => ({ x: p.x, y: p.y }))),
  ];
  const snapped = (p: PlanPoint) => {
    const hit = snapPoint(p, snapTargets, SNAP_PX / Math.max(transformK, 1e-9));
    return hit ? { x: hit.x, y: hit.y } : p;
  };

  const handleTap = (point: PlanPoint, hit: PlanHit | undefined) => {
    setTapNotice(undefined);
    switch (tool) {
      case 'select':
        if (hit?.type === 'item' || hit?.type === 'reference' || hit?.type === 'run') setSelection({ type: hit.type, id: hit.id });
        else setSelection(undefined);
        return;
      case 'reference':
        reference.tap(point);
        return;
      case 'feature':
        feature.tap(point, hit, snapped);
        return;
      case 'route':
        setTapNotice(route.tap(point, hit, snapped));
        return;
      case 'ties':
        if (ties.tap(hit) === 'started') setTool('ties');
        return;
      case 'calibrate':
        setTapNotice(calibrate.tap(point));
        return;
      case 'north':
        return;
    }
  };

  const handleDragEnd = (hit: PlanHit, point: PlanPoint) => {
    if (hit.type === 'item' && tool === 'select') void moveItem(hit.id, point);
    if (tool === 'feature') feature.dragEnd(hit, point, snapped);
    if (tool === 'route') route.dragEnd(hit, point, snapped);
  };

  const hint = tapNotice ?? hintFor();
  function hintFor(): string {
    switch (tool) {
      case 'select':
        return canRecord ? 'Tap something to see it. Drag an item placed by hand to move it.' : 'Tap something to see it. You can look at this plan but not change it.';
      case 'reference':
        return 'Tap the plan where the reference point is: a house corner, a gate post, the meter base.';
      case 'feature':
        return feature.hint;
      case 'route':
        return route.hint;
      case 'ties':
        return ties.hint;
      case 'calibrate':
        return calibrate.hint;
      case 'north':
        return 'Drag the north arrow round, or type the bearing of the plan’s top, then save.';
    }
  }

  const panel = (() => {
    switch (tool) {
      case 'select':
      case 'reference':
        return (
          <SelectionCard
            jobId={job.id}
            asBuilt={asBuilt}
            analysis={analysis}
            selection={selection}
            canRecord={canRecord}
            onPlaceByTies={startTies}
            onDrawRoute={startRoute}
          />
        );
      case 'route':
        return <RoutePanel {...route.panel} onRunChange={startRoute} isSaving={isSaving} />;
      case 'ties':
        return <TiesPanel {...ties.panel} onItemChange={startTies} isSaving={isSaving} />;
      case 'calibrate':
        return <CalibratePanel {...calibrate.panel} />;
      case 'feature':
        return <FeaturePanel {...feature.panel} />;
      case 'north':
        return <NorthPanel {...north.panel} />;
    }
  })();

  return (
    <>
      <title>{`Plan: ${job.title} · Loamline`}</title>
      {siteConflict.dialog}
      <header className={styles.header}>
        <Link to={paths.job.getHref(job.id)} className={styles.back} aria-label={`Back to the job ${job.title}`}>
          <ArrowLeft24Regular aria-hidden />
        </Link>
        <Text as="h2" size={500} weight="semibold" className={styles.title}>
          Plan: {job.title}
        </Text>
      </header>
      <div className={styles.layout}>
        <div className={styles.main}>
          <SaveStateBar jobId={job.id} />
          {isImageError && (
            <MessageBar intent="warning">
              <MessageBarBody>The plan image could not be loaded. The plan works without it.</MessageBarBody>
            </MessageBar>
          )}
          <PlanToolbar tools={tools} tool={tool} onToolChange={setTool} />
          <div className={styles.canvas}>
            <PlanCanvas
              model={model}
              onTap={handleTap}
              onDragEnd={handleDragEnd}
              onZoom={setTransformK}
              hint={hint}
              extraButtons={<LayersMenu layers={layers} onChange={setLayers} />}
              onNorthTurn={tool === 'north' ? north.turn : undefined}
              fitKey={`${planImage?.url ?? ''}|${site.planCalibration ? JSON.stringify(site.planCalibration) : ''}|${imageHref ? 'loaded' : ''}`}
              label={`Plan of ${job.site.label}`}
            />
          </div>
        </div>
        <div className={styles.side}>{panel}</div>
      </div>
      <ReferencePointDialog key={reference.dialogKey} {...reference.dialog} />
    </>
  );
}
