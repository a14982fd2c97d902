import { makeStyles, Spinner, Text, tokens } from '@fluentui/react-components';
import { Link } from 'react-router';

import { paths } from '../../../config/paths';
import { describeRequestError } from '../../../lib/form-errors';
import { useJobPackets } from '../api/get-job-packets';
import { JobDeliveries } from './job-deliveries';
import { SendPacketDialog } from './send-packet-dialog';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  row: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalS,
    padding: `${tokens.spacingVerticalM} ${tokens.spacingHorizontalL}`,
    borderRadius: tokens.borderRadiusLarge,
    backgroundColor: tokens.colorNeutralBackground1,
    boxShadow: tokens.shadow2,
  },
  head: { display: 'flex', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: tokens.spacingHorizontalM },
  link: { color: tokens.colorBrandForegroundLink, fontWeight: tokens.fontWeightSemibold },
  muted: { color: tokens.colorNeutralForeground2 },
  failed: { color: tokens.colorPaletteRedForeground1 },
});

type IssuedJob = { id: string; title: string };

/** The site page's issued packets: the newest ready revision of each issued job, to send and follow. */
export function SitePackets({ siteLabel, jobs }: { siteLabel: string; jobs: readonly IssuedJob[] }) {
  const styles = useStyles();
  if (jobs.length === 0) return <Text className={styles.muted}>No packet issued for this site yet.</Text>;
  return (
    <ul className={styles.list} aria-label="Issued packets">
      {jobs.map((job) => (
        <SitePacketRow key={job.id} job={job} siteLabel={siteLabel} />
      ))}
    </ul>
  );
}

function SitePacketRow({ job, siteLabel }: { job: IssuedJob; siteLabel: string }) {
  const styles = useStyles();
  const packets = useJobPackets(job.id);
  const ready = packets.data?.filter((p) => p.status === 'ready').sort((a, b) => b.revision - a.revision)[0];
  return (
    <li className={styles.row} aria-label={`Packet of ${job.title}`}>
      <div className={styles.head}>
        <span>
          <Link to={paths.job.getHref(job.id)} className={styles.link}>
            {job.title}
          </Link>
          {ready && <Text className={styles.muted}> · revision {ready.revision}</Text>}
        </span>
        {ready && <SendPacketDialog revisionId={ready.id} revision={ready.revision} siteLabel={siteLabel} />}
      </div>
      {packets.isPending && <Spinner size="tiny" label="Loading the packet" />}
      {packets.isError && <Text className={styles.failed}>{describeRequestError(packets.error)}</Text>}
      {packets.data && !ready && <Text className={styles.muted}>No revision is ready to send yet.</Text>}
      <JobDeliveries jobId={job.id} />
    </li>
  );
}
