import { Button, makeStyles, Tab, TabList, Text, tokens } from '@fluentui/react-components';
import { ChevronDown20Regular, ChevronUp20Regular } from '@fluentui/react-icons';
import { useCallback, useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { Role } from '@domain/auth/roles';

import { PageHeader } from '../../../components/page-header';
import { paths } from '../../../config/paths';
import { useMediaQuery } from '../../../lib/use-media-query';
import { PhotosProvider } from '../../photos';
import { useJobPhotos } from '../../photos';
import { PhotosSection } from '../../photos';
import type { JobAsBuiltResponse } from '../../job-record';
import { WorkspaceFocusContext } from '../hooks/workspace-focus';
import { fieldDomId, SECTION_LABELS, SECTIONS, type FieldTarget, type SectionId } from '../utils/finding-target';
import { jobPermissions } from '../utils/job-permissions';

import { AmpSetupSection } from './amp-setup-section';
import { ChecksSection } from './checks-section';
import { FindingsPanel } from './findings-panel';
import { ItemsSection } from './items-section';
import { JobDetailsDialog } from './job-details-dialog';
import { JobStatusActions } from './job-status-actions';
import { JobStatusBadge } from './job-status-badge';
import { NotesSection } from './notes-section';
import { IssuePacketDialog } from './issue-packet-dialog';
import { PacketCard } from './packet-card';
import { RunsSection } from './runs-section';
import { SaveStateBar } from './save-state-bar';
import { SignOffCard } from './sign-off-card';
import { ZonesSection } from './zones-section';

const useStyles = makeStyles({
  layout: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalL,
    alignItems: 'start',
    '@media (min-width: 1024px)': { gridTemplateColumns: 'minmax(0, 1fr) minmax(18rem, 24rem)', columnGap: tokens.spacingHorizontalXXL },
  },
  main: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL, minWidth: 0 },
  aside: { '@media (min-width: 1024px)': { position: 'sticky', top: tokens.spacingVerticalL, maxHeight: 'calc(100vh - 2rem)', overflowY: 'auto' } },
  // Every section and its count in view on a 390 px phone: four to a row, two rows, no sideways scroll.
  tabs: {
    display: 'grid',
    gridTemplateColumns: 'repeat(4, minmax(0, 1fr))',
    '@media (min-width: 1024px)': { gridTemplateColumns: 'repeat(8, minmax(0, 1fr))' },
    backgroundColor: tokens.colorNeutralBackground1,
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow2,
  },
  tab: {
    minHeight: '56px',
    minWidth: 0,
    paddingInline: tokens.spacingHorizontalXS,
    justifyContent: 'center',
    '& .fui-Tab__content': { display: 'flex', flexDirection: 'column', alignItems: 'center', whiteSpace: 'normal', textAlign: 'center', lineHeight: tokens.lineHeightBase200 },
  },
  tabLabel: { fontSize: tokens.fontSizeBase200, overflowWrap: 'anywhere' },
  tabCount: { fontSize: tokens.fontSizeBase200, color: tokens.colorNeutralForeground3 },
  meta: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', gap: `${tokens.spacingVerticalS} ${tokens.spacingHorizontalM}` },
  // Links in the header are targets too: 44 px tall on a touch screen, not 22 px of inline text.
  link: {
    color: tokens.colorBrandForegroundLink,
    display: 'inline-flex',
    alignItems: 'center',
    minHeight: '44px',
    paddingInline: tokens.spacingHorizontalXS,
  },
  phoneSummary: {
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'space-between',
    width: '100%',
    minHeight: '48px',
  },
});

type JobWorkspaceProps = { data: JobAsBuiltResponse; actor: { id: string; role: Role } };

/**
 * The job as the crew records it: header with the status moves, the findings, and one section at a
 * time (runs, equipment, wall entries, zones, amplifier setup, checks, photos, notes).
 */
export function JobWorkspace({ data, actor }: JobWorkspaceProps) {
  const styles = useStyles();
  const isWide = useMediaQuery('(min-width: 1024px)');
  const [searchParams, setSearchParams] = useSearchParams();
  const [target, setTarget] = useState<FieldTarget | undefined>();
  const [isFindingsOpen, setIsFindingsOpen] = useState(false);
  const { job, asBuilt, analysis } = data;
  const section: SectionId = (SECTIONS as readonly string[]).includes(searchParams.get('section') ?? '')
    ? (searchParams.get('section') as SectionId)
    : 'runs';
  const permissions = jobPermissions(actor, job);
  const { data: photoList } = useJobPhotos(job.id);
  const counts = sectionCounts(data, photoList?.items.length ?? 0);

  const showSection = useCallback(
    (next: SectionId) => {
      setSearchParams(
        (current) => {
          const params = new URLSearchParams(current);
          if (next === 'runs') params.delete('section');
          else params.set('section', next);
          return params;
        },
        { replace: true },
      );
    },
    [setSearchParams],
  );

  const focus = useCallback(
    (next: FieldTarget) => {
      showSection(next.section);
      setIsFindingsOpen(false);
      // A fresh object each time, so following the same link twice focuses again.
      setTarget({ ...next });
    },
    [showSection],
  );

  // After the section and the record's editor have rendered, put the cursor in the field.
  useEffect(() => {
    if (!target?.recordId || !target.field) return;
    const id =
      target.field === 'depth' && target.readingIndex !== undefined
        ? fieldDomId(target.recordId, 'depth', target.readingIndex)
        : fieldDomId(target.recordId, target.field);
    let tries = 0;
    const timer = window.setInterval(() => {
      tries += 1;
      const element = document.getElementById(id) ?? document.getElementById(fieldDomId(target.recordId!, 'label'));
      if (element || tries > 20) {
        window.clearInterval(timer);
        element?.scrollIntoView?.({ block: 'center' });
        element?.focus();
      }
    }, 50);
    return () => window.clearInterval(timer);
  }, [target]);

  const focusValue = useMemo(() => ({ target, focus }), [focus, target]);
  const openFindings = analysis.summary.critical + analysis.summary.warning;

  const findings = <FindingsPanel analysis={analysis} asBuilt={asBuilt} siteRecords={data.records.siteRecords} />;

  return (
    <WorkspaceFocusContext.Provider value={focusValue}>
      <PhotosProvider data={data} canChange={permissions.canAddField}>
      <PageHeader
        title={job.title}
        description={
          <span className={styles.meta}>
            <JobStatusBadge status={job.status} />
            <Link to={paths.site.getHref(job.site.id)} className={styles.link}>
              {job.site.label}, {job.site.city}
            </Link>
            <Link to={paths.jobPlan.getHref(job.id)} className={styles.link}>
              Open the plan
            </Link>
            <Link to={paths.jobDrawings.getHref(job.id)} className={styles.link}>
              Drawings
            </Link>
            <span>{job.customer.name}</span>
            {job.revision > 1 && <span>Revision {job.revision}</span>}
          </span>
        }
        actions={
          <>
            <JobDetailsDialog job={job} canChange={permissions.canChangeDetails} />
            <JobStatusActions job={job} analysis={analysis} actor={actor} />
            {permissions.canIssue && <IssuePacketDialog jobId={job.id} jobVersion={job.version} findings={analysis.findings} />}
          </>
        }
      />
      <div className={styles.layout}>
        <div className={styles.main}>
          <SaveStateBar jobId={job.id} asBuilt={asBuilt} canEdit={permissions.canRecord || permissions.canAddField || permissions.canChangeNotes} />
          {!isWide &&
            (isFindingsOpen ? (
              <>
                <Button appearance="secondary" className={styles.phoneSummary} icon={<ChevronUp20Regular />} iconPosition="after" onClick={() => setIsFindingsOpen(false)}>
                  Hide findings
                </Button>
                {findings}
              </>
            ) : (
              <Button
                appearance="secondary"
                className={styles.phoneSummary}
                icon={<ChevronDown20Regular />}
                iconPosition="after"
                onClick={() => setIsFindingsOpen(true)}
                aria-label={`Findings: ${openFindings} to look at. Show them`}
              >
                <Text weight="semibold">
                  {openFindings === 0 ? 'Findings: nothing to look at' : `Findings: ${openFindings} to look at`}
                </Text>
              </Button>
            ))}
          <TabList
            className={styles.tabs}
            selectedValue={section}
            onTabSelect={(_event, next) => showSection(next.value as SectionId)}
            aria-label="Parts of the as-built"
          >
            {SECTIONS.map((id) => (
              <Tab key={id} value={id} className={styles.tab} aria-label={`${SECTION_LABELS[id]} (${counts[id]})`}>
                <span className={styles.tabLabel}>{SHORT_SECTION_LABELS[id]}</span>
                <span className={styles.tabCount}>{counts[id]}</span>
              </Tab>
            ))}
          </TabList>
          {section === 'runs' && <RunsSection data={data} canRecord={permissions.canRecord} canAddField={permissions.canAddField} />}
          {section === 'equipment' && <ItemsSection data={data} canRecord={permissions.canRecord} kinds="equipment" />}
          {section === 'walls' && <ItemsSection data={data} canRecord={permissions.canRecord} kinds="walls" />}
          {section === 'zones' && <ZonesSection data={data} canRecord={permissions.canRecord} />}
          {section === 'amp' && <AmpSetupSection data={data} canRecord={permissions.canRecord} />}
          {section === 'checks' && <ChecksSection data={data} canAddField={permissions.canAddField} />}
          {section === 'photos' && <PhotosSection />}
          {section === 'notes' && <NotesSection data={data} canChange={permissions.canChangeNotes} />}
          {(job.status === 'submitted' || job.status === 'ready_to_issue') && (
            <SignOffCard
              jobId={job.id}
              canSign={permissions.canSign}
              crewLeadName={job.crewLead?.name ?? ''}
              homeownerName={job.customer.name}
            />
          )}
          {(job.status === 'ready_to_issue' || job.status === 'issued') && (
            <PacketCard jobId={job.id} />
          )}
        </div>
        {isWide && <aside className={styles.aside}>{findings}</aside>}
      </div>
      </PhotosProvider>
    </WorkspaceFocusContext.Provider>
  );
}

/** Names short enough for a quarter of a phone's width; the tab's accessible name keeps the full one. */
const SHORT_SECTION_LABELS: Record<SectionId, string> = { ...SECTION_LABELS, walls: 'Walls', amp: 'Amp setup' };

/** How many records each section holds, shown under its name. */
function sectionCounts({ asBuilt, job }: JobAsBuiltResponse, photos: number): Record<SectionId, number> {
  const walls = asBuilt.items.filter((item) => item.kind === 'wall_entry').length;
  return {
    runs: asBuilt.runs.length,
    equipment: asBuilt.items.length - walls,
    walls,
    zones: asBuilt.zones.length,
    amp: asBuilt.items.filter((item) => item.kind === 'amplifier').length,
    checks: asBuilt.checks.length,
    photos,
    notes: job.notes && job.notes.trim() !== '' ? 1 : 0,
  };
}
