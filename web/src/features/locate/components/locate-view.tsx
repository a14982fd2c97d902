import { useEffect, useMemo, useState } from 'react';
import { type DateStyle, formatDate as formatWorkDate, spell } from '@domain/format/date-time';
import { formatToleranceZone } from '@domain/format/length';

import { InstallerCard } from '../../../components/installer-card';
import { PlainButton, PlainSwitch } from '../../../components/plain/controls';
import { DownloadIcon, LocationIcon, PrintIcon, ShareIcon, WarningFilledIcon } from '../../../components/plain/icons';
import { Text } from '../../../components/plain/text';
import { PREVIEW_PAPER } from '../../../config/canvas-theme';
import { companyDateStyle, formatDate } from '../../../lib/format-date';
import { formatLength } from '../../../lib/units';
import type { LocateViewResponse } from '../api/get-locate-view';
import { useMyPosition } from '../hooks/use-my-position';
import { geoJsonToKml, kmlFileName } from '../utils/kml';

import styles from './locate-view.module.css';
import { depthLabel, SiteMapPlan, SiteMapPlanPlaceholder } from './site-map-plan';

/** Class names joined, the falsy ones left out. */
function cx(...names: (string | false | undefined)[]): string {
  return names.filter(Boolean).join(' ');
}

const METHOD_LABELS: Record<LocateViewResponse['runs'][number]['method'], string> = {
  direct_burial: 'direct burial',
  conduit: 'in conduit',
  under_hardscape_sleeve: 'sleeve under hardscape',
  indoor: 'indoors',
};

function Cautions({ view }: { view: LocateViewResponse }) {
  // Written as the packet and the locate sheet write it (the shared formatter): 18 in, or 0.5 m.
  const zone = formatToleranceZone(view.toleranceZoneM, view.units);
  return (
    <section className={styles.cautions} aria-labelledby="locate-cautions" role="region">
      <Text as="h2" id="locate-cautions" size={500} weight="bold" className={styles.cautionTitle}>
        <WarningFilledIcon />
        Before you dig
      </Text>
      <ul className={styles.cautionList}>
        <li>
          <Text weight="semibold">Call the one-call {spell('center', view.locale)} (811 in the United States) before any digging.</Text>
        </li>
        <li>
          <Text weight="semibold">
            The cables on this map are private low-voltage lines: one-call locators do not mark them. This map is the only
            record.
          </Text>
        </li>
        <li>
          <Text weight="semibold">Hand-dig within {zone} of any line on this map.</Text>
        </li>
        <li>
          <Text weight="semibold">Mark each cable route on the ground with orange paint or flags; outline the planned dig area in white.</Text>
        </li>
        <li>
          <Text weight="semibold">
            Depths are as installed. Grading, landscaping and settling since then change them: expect cables shallower
            than shown.
          </Text>
        </li>
      </ul>
      {/* The answer's one-paragraph summary (cautionSummary) says what the points above say: not repeated. */}
      <details>
        <summary>
          <Text weight="semibold">All locate steps and safety cautions</Text>
        </summary>
        <ul className={styles.cautionList}>
          {[...view.locateSteps, ...view.cautions].map((c) => (
            <li key={c.title}>
              <Text weight="semibold">{c.title}. </Text>
              <Text>{c.body}</Text>
            </li>
          ))}
        </ul>
      </details>
    </section>
  );
}

function RunDetails({ run, dateStyle }: { run: LocateViewResponse['runs'][number]; dateStyle: DateStyle }) {
  const [openPhoto, setOpenPhoto] = useState<string | undefined>();
  const photo = run.photos.find((p) => p.id === openPhoto);
  return (
    <div className={styles.section}>
      <img src={run.depthProfileUrl} alt={`Depth profile of ${run.label}`} className={styles.profile} style={{ backgroundColor: PREVIEW_PAPER }} />
      {run.photos.length === 0 ? (
        <Text className={styles.muted}>No trench photos for this run.</Text>
      ) : (
        <>
          <Text weight="semibold">Trench photos</Text>
          <div className={styles.photos}>
            {run.photos.map((p) => (
              <button key={p.id} type="button" className={styles.thumbButton} onClick={() => setOpenPhoto(openPhoto === p.id ? undefined : p.id)} aria-pressed={openPhoto === p.id}>
                <img src={p.thumbUrl} alt={p.caption ?? `Trench photo of ${run.label}`} className={styles.thumb} loading="lazy" />
              </button>
            ))}
          </div>
          {photo && (
            <figure className={styles.figure}>
              <img src={photo.screenUrl} alt={photo.caption ?? `Trench photo of ${run.label}, large`} className={styles.screen} />
              {(photo.caption || photo.takenAt) && (
                <figcaption className={styles.muted}>{[photo.caption, photo.takenAt && formatDate(photo.takenAt, dateStyle)].filter(Boolean).join(' · ')}</figcaption>
              )}
            </figure>
          )}
        </>
      )}
    </div>
  );
}

type ShareState = 'idle' | 'shared' | 'copied' | 'failed';

/**
 * Shares this page's link with the phone's share sheet (Web Share API); where there is none, copies it.
 * A share the user cancels is no failure.
 */
export async function shareLocateLink(url: string, title: string): Promise<ShareState> {
  if (typeof navigator.share === 'function') {
    try {
      await navigator.share({ title, text: `Buried cable map: ${title}`, url });
      return 'shared';
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') return 'idle';
    }
  }
  try {
    await navigator.clipboard.writeText(url);
    return 'copied';
  } catch {
    return 'failed';
  }
}

function ShareButton({ title }: { title: string }) {
  const [state, setState] = useState<ShareState>('idle');
  // The page's own link (the token is in its path), without its query or fragment.
  const url = new URL(window.location.pathname, window.location.origin).href;
  return (
    <div className={styles.share}>
      <PlainButton icon={<ShareIcon />} className={styles.tallButton} onClick={async () => setState(await shareLocateLink(url, title))}>
        Share this map
      </PlainButton>
      <Text role="status" aria-live="polite">
        {state === 'copied' ? 'Link copied: paste it in a message to whoever is digging.' : state === 'shared' ? 'Link shared.' : state === 'failed' ? `Copy this link: ${url}` : ''}
      </Text>
    </div>
  );
}

/** Runs shallower than the depth rule first (the ones that can hurt), otherwise in the order recorded. */
export function runsShallowFirst<T extends { isShallow: boolean }>(runs: readonly T[]): T[] {
  return [...runs.filter((r) => r.isShallow), ...runs.filter((r) => !r.isShallow)];
}

/** Every taped tie, grouped by the reference point it was measured from, in the viewer's units. */
function MeasureFrom({ view }: { view: LocateViewResponse }) {
  const groups = view.map.referencePoints
    .map((ref) => ({
      ref,
      ties: view.map.items.flatMap((item) => item.ties.filter((t) => t.referencePointId === ref.id).map((t) => ({ item, distanceM: t.distanceM }))),
    }))
    .filter((g) => g.ties.length > 0);
  return (
    <section className={styles.measureFrom} aria-labelledby="locate-measure-from">
      <Text as="h3" id="locate-measure-from" size={400} weight="semibold" className={styles.flush}>
        Measure from
      </Text>
      {groups.length === 0 ? (
        <Text className={styles.muted}>No taped ties were recorded at this site: positions on the map are as drawn.</Text>
      ) : (
        groups.map(({ ref, ties }) => (
          <div key={ref.id}>
            <Text weight="semibold" block>
              {ref.label}
            </Text>
            <ul className={styles.measureList}>
              {ties.map(({ item, distanceM }) => (
                <li key={item.id}>
                  <Text>
                    {formatLength(distanceM, view.units, 'long')} to {item.kind === 'wall_entry' ? `wall entry ${item.label}` : item.label}
                  </Text>
                </li>
              ))}
            </ul>
          </div>
        ))
      )}
      <Text size={200} className={styles.muted}>
        Tape from the reference point on the ground; where two ties meet is the spot.
      </Text>
    </section>
  );
}

/**
 * "Show my position": only when the site has a GPS origin (else one line saying why). The phone's fix is
 * drawn on the map by the caller; this says plainly what it is worth.
 */
function MyPositionControl({ view, position }: { view: LocateViewResponse; position: ReturnType<typeof useMyPosition> }) {
  if (!view.map.frame.origin) {
    return (
      <Text size={200} className={styles.muted} data-testid="no-position-reason">
        No “Show my position”: this site has no GPS origin, so a phone position cannot be placed on its plan.
      </Text>
    );
  }
  const { state, toggle } = position;
  const on = state.status === 'on' || state.status === 'waiting';
  return (
    <div className={styles.positionBox}>
      <PlainButton icon={<LocationIcon />} className={styles.tallButton} aria-pressed={on} onClick={toggle}>
        {on ? 'Hide my position' : 'Show my position'}
      </PlainButton>
      <Text size={200} role="status" aria-live="polite">
        {state.status === 'waiting'
          ? 'Finding your position…'
          : state.status === 'on'
            ? `Your phone puts you within about ${formatLength(state.position.accuracyM, view.units, 'long')} of the black dot.`
            : state.status === 'error'
              ? state.message
              : ''}
      </Text>
      <Text size={200} className={styles.muted}>
        Phone positions are good to several metres at best: use the dot to find your way around the yard, never in place of the taped ties.
      </Text>
    </div>
  );
}

/**
 * False for the first frame, true from the next task on. The map (label placement, pan and zoom, its
 * measuring) is the heaviest part of the page to draw: drawn one task after the rest, the cautions and
 * the installer's number show first and a slow phone's main thread is never held by one long task
 * (issue 17). Its frame keeps the map's place meanwhile, so nothing moves.
 */
function useAfterFirstFrame(): boolean {
  const [after, setAfter] = useState(false);
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setAfter(true), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      if (timer !== undefined) clearTimeout(timer);
    };
  }, []);
  return after;
}

/** The contractor's view of a site: cautions first, then who installed it, the map and the runs. */
export function LocateView({ view }: { view: LocateViewResponse }) {
  const [selectedRunId, setSelectedRunId] = useState<string | undefined>();
  const [showTies, setShowTies] = useState(false);
  const { site, installer } = view;
  const runs = useMemo(() => runsShallowFirst(view.runs), [view.runs]);
  const shallowRunIds = useMemo(() => new Set(view.runs.filter((r) => r.isShallow).map((r) => r.id)), [view.runs]);
  const hasTies = view.map.items.some((item) => item.position !== null && item.ties.length > 0);
  const position = useMyPosition(view.map.frame);
  const mapShown = useAfterFirstFrame();
  // The installer's zone and locale, as on its packets (a visitor has no company of their own).
  const dateStyle = useMemo(() => companyDateStyle({ timeZone: view.timeZone, locale: view.locale }), [view.timeZone, view.locale]);

  const selectFromMap = (runId: string) => {
    setSelectedRunId(runId);
    // The profile opens in the list: bring it into view (the list is below the map on a phone).
    requestAnimationFrame(() => document.getElementById(`locate-run-${runId}`)?.scrollIntoView?.({ behavior: 'smooth', block: 'start' }));
  };

  return (
    <div className={styles.root}>
      <Cautions view={view} />

      <section className={styles.section} aria-labelledby="locate-site">
        <Text as="h1" id="locate-site" size={600} weight="bold" className={styles.flush}>
          {site.label}
        </Text>
        <address className={styles.address}>
          <Text>{site.addressLine1}</Text>
          {site.addressLine2 && <Text>{site.addressLine2}</Text>}
          <Text>{[site.postalCode, site.city, site.region].filter(Boolean).join(' ')}</Text>
        </address>
        {view.link.note && <Text>Note from the homeowner: {view.link.note}</Text>}
        <ShareButton title={site.label} />
      </section>

      <InstallerCard installer={installer} headingId="locate-installer" reason="locate" />

      <section className={styles.section} aria-labelledby="locate-map">
        <Text as="h2" id="locate-map" size={500} weight="semibold" className={styles.flush}>
          Map of buried cables
        </Text>
        <MyPositionControl view={view} position={position} />
        {hasTies ? (
          <PlainSwitch checked={showTies} onChange={setShowTies} label="Show taped ties on the map" />
        ) : (
          <Text className={styles.muted}>No taped ties were recorded at this site.</Text>
        )}
        <div className={styles.mapLayout}>
          <div className={styles.mapMain}>
            {mapShown ? (
              <SiteMapPlan
                map={view.map}
                units={view.units}
                locale={view.locale}
                selectedRunId={selectedRunId}
                onSelectRun={selectFromMap}
                shallowRunIds={shallowRunIds}
                showTies={showTies}
                myPosition={position.state.status === 'on' ? position.state.position : undefined}
              />
            ) : (
              <SiteMapPlanPlaceholder />
            )}
          </div>
          {hasTies && (
            <div className={styles.mapSide}>
              <MeasureFrom view={view} />
            </div>
          )}
        </div>
        <a href={view.sheetUrl} target="_blank" rel="noopener" className={styles.secondaryLink}>
          <PrintIcon />
          Print locate sheet (PDF, one page)
        </a>
        {view.geojsonUrl && (
          <a href={view.geojsonUrl} download className={styles.secondaryLink}>
            <DownloadIcon />
            Download GeoJSON
          </a>
        )}
        {view.map.geojson ? (
          <a href={`data:application/vnd.google-earth.kml+xml;charset=utf-8,${encodeURIComponent(geoJsonToKml(view.map.geojson, site.label))}`} download={kmlFileName(site.label)} className={styles.secondaryLink}>
            <DownloadIcon />
            Download KML
          </a>
        ) : (
          <div>
            <PlainButton disabled icon={<DownloadIcon />} aria-describedby="locate-kml-why">
              Download KML
            </PlainButton>
            <Text id="locate-kml-why" size={200} className={styles.muted} block>
              No KML or GeoJSON: this site has no GPS origin, so the map has plan positions only. Measure from the reference points.
            </Text>
          </div>
        )}
      </section>

      <section className={styles.section} aria-labelledby="locate-runs">
        <Text as="h2" id="locate-runs" size={500} weight="semibold" className={styles.flush}>
          Cable runs
        </Text>
        {runs.length === 0 ? (
          <Text className={styles.muted}>No runs have been recorded at this site.</Text>
        ) : (
          <ul className={styles.runs}>
            {runs.map((run) => {
              const open = run.id === selectedRunId;
              return (
                <li key={run.id} id={`locate-run-${run.id}`} className={cx(styles.run, run.isShallow && styles.shallowRun)} data-shallow={run.isShallow ? 'true' : undefined}>
                  <PlainButton
                    appearance="subtle"
                    className={styles.runButton}
                    aria-expanded={open}
                    onClick={() => setSelectedRunId(open ? undefined : run.id)}
                  >
                    <span>
                      <Text weight="semibold" block>
                        {run.label}
                        {run.isAbandoned ? ' (abandoned)' : run.isSpare ? ' (spare)' : ''}
                      </Text>
                      <Text size={200} className={styles.muted} block>
                        {run.cable} {run.gauge} · {METHOD_LABELS[run.method]}
                      </Text>
                      <Text size={200} className={styles.muted} block>
                        {runProvenance(run)}
                      </Text>
                      {run.isShallow && run.minDepthM !== null && (
                        <Text size={200} weight="semibold" className={styles.shallowNote} block>
                          <WarningFilledIcon />
                          Shallower than the depth rule: {formatLength(run.minDepthM, view.units, 'short')} where the rule asks
                          {run.minCoverM !== null ? ` ${formatLength(run.minCoverM, view.units, 'short')}` : ' more'}. Hand-dig.
                        </Text>
                      )}
                    </span>
                    <Text weight="semibold">
                      {depthLabel(run.minDepthM, view.units)}
                      {run.maxDepthM !== null && run.minDepthM !== null && run.maxDepthM !== run.minDepthM
                        ? ` – ${formatLength(run.maxDepthM, view.units, 'short')}`
                        : ''}
                    </Text>
                  </PlainButton>
                  {open && <RunDetails run={run} dateStyle={dateStyle} />}
                </li>
              );
            })}
          </ul>
        )}
      </section>

      <Text size={200} className={styles.muted}>
        This link works until {formatDate(view.link.expiresAt, dateStyle)}. Map as of {formatDate(view.generatedAt, dateStyle)}.
      </Text>
    </div>
  );
}

/** When a run went in and by which job, and since when it is abandoned (issue 21: never a per-job revision number). */
export function runProvenance(run: { installedOn?: string | null; installedByJobTitle?: string; abandonedOn?: string | null }): string {
  const installed = run.installedOn ? `Installed ${formatWorkDate(run.installedOn)}` : 'Installed (date not recorded)';
  const by = run.installedByJobTitle ? ` by “${run.installedByJobTitle}”` : '';
  return `${installed}${by}${run.abandonedOn ? ` · abandoned since ${formatWorkDate(run.abandonedOn)}` : ''}`;
}
