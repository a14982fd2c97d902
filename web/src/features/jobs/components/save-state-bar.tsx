import { Button, makeStyles, MessageBar, MessageBarActions, MessageBarBody, MessageBarTitle, Spinner, tokens } from '@fluentui/react-components';
import { Link } from 'react-router';
import type { AsBuilt } from '@domain/as-built/as-built.schema';

import { paths } from '../../../config/paths';
import { useDraftKeys } from '../../../lib/drafts';
import { useOnline } from '../../../lib/use-online';
import { useJobWriter } from '../hooks/job-writer';

const useStyles = makeStyles({
  button: { minHeight: '44px' },
  list: { margin: 0, paddingInlineStart: tokens.spacingHorizontalL },
  link: { display: 'inline-flex', alignItems: 'center', minHeight: '44px', color: tokens.colorBrandForegroundLink },
});

/** A form with unsaved input: what it is called on the screen and where it is. */
export type DraftForm = { key: string; name: string; href: string };

/**
 * Names the form behind a draft key (`job:<id>:run:<runId>`, `job:<id>:setup:<channelId>` …, see the
 * forms' `draftKey`) and links to its section; records are named from the as-built when it is at hand.
 */
export function draftForm(key: string, jobId: string, asBuilt?: AsBuilt): DraftForm {
  const [, , kind = '', id = ''] = key.split(':');
  const job = paths.job.getHref(jobId);
  const section = (name: string, part?: string) => ({ key, name, href: part ? `${job}?section=${part}` : job });
  const item = asBuilt?.items.find((candidate) => candidate.id === id);
  const run = asBuilt?.runs.find((candidate) => candidate.id === id);
  switch (kind) {
    case 'run':
      return section(id === 'new' ? 'New run' : `Run ${run?.label ?? ''}`.trim());
    case 'depth':
      return section(`Depth reading on ${run?.label ?? 'a run'}`);
    case 'zone':
      return section('New zone', 'zones');
    case 'setup': {
      const amp = asBuilt?.items.find((candidate) => candidate.kind === 'amplifier' && candidate.channels.some((channel) => channel.id === id));
      const channel = amp?.kind === 'amplifier' ? amp.channels.find((candidate) => candidate.id === id) : undefined;
      return section(amp && channel ? `Setup of ${amp.label} · ${channel.name}` : 'Amplifier setup', 'amp');
    }
    case 'item':
      if (id.startsWith('new')) return section(id.includes('wall_entry') ? 'New wall entry' : 'New equipment', id.includes('wall_entry') ? 'walls' : 'equipment');
      return section(item?.label ?? 'Equipment', item?.kind === 'wall_entry' ? 'walls' : 'equipment');
    case 'check':
      return section('New check', 'checks');
    case 'notes':
      return section('Notes', 'notes');
    case 'plan-route':
      return { key, name: `Route on the plan${run ? ` (${run.label})` : ''}`, href: paths.jobPlan.getHref(jobId) };
    case 'plan-ties':
      return { key, name: `Ties on the plan${item ? ` (${item.label})` : ''}`, href: paths.jobPlan.getHref(jobId) };
    case 'plan-calibration':
      return { key, name: 'Plan scale', href: paths.jobPlan.getHref(jobId) };
    default:
      return section('A form');
  }
}

/** Tells the crew what is not on the server yet: changes waiting for a connection, forms not saved. */
export function SaveStateBar({ jobId, asBuilt, canEdit = true }: { jobId: string; asBuilt?: AsBuilt; canEdit?: boolean }) {
  const styles = useStyles();
  const isOnline = useOnline();
  const { pending, retryPending, isSending } = useJobWriter();
  const drafts = useDraftKeys(`job:${jobId}:`).map((key) => draftForm(key, jobId, asBuilt));

  if (pending.length > 0) {
    return (
      <MessageBar intent="warning" layout="multiline">
        <MessageBarBody>
          <MessageBarTitle>Waiting to send ({pending.length})</MessageBarTitle>
          {pending.length === 1 ? 'One change is' : `${pending.length} changes are`} kept on this device and not on the server yet.{' '}
          {isOnline ? 'Sending them now and again every few seconds.' : 'No connection. They are sent as soon as the phone is back online.'}{' '}
          ({pending.map((entry) => entry.write.label).join('; ')})
        </MessageBarBody>
        <MessageBarActions>
          <Button className={styles.button} disabled={isSending} icon={isSending ? <Spinner size="tiny" /> : undefined} onClick={retryPending}>
            Send now
          </Button>
        </MessageBarActions>
      </MessageBar>
    );
  }
  if (!isOnline) {
    return (
      <MessageBar intent="warning">
        <MessageBarBody>No connection. Keep recording: what you save is kept on this device and sent later.</MessageBarBody>
      </MessageBar>
    );
  }
  // A job that can no longer be edited has nothing to finish: no banner about its forms.
  if (drafts.length > 0 && canEdit) {
    return (
      <MessageBar intent="info" layout="multiline">
        <MessageBarBody>
          <MessageBarTitle>Not saved yet</MessageBarTitle>
          Kept on this device until you save or discard it:
          <ul className={styles.list}>
            {drafts.map((form) => (
              <li key={form.key}>
                <Link className={styles.link} to={form.href}>
                  {form.name}
                </Link>
              </li>
            ))}
          </ul>
        </MessageBarBody>
      </MessageBar>
    );
  }
  return null;
}
