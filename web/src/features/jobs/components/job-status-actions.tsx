import { Button, Field, makeStyles, Text, Textarea, tokens } from '@fluentui/react-components';
import { useState } from 'react';
import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import type { JobResponse } from '@domain/jobs/job.schema';
import type { Role } from '@domain/auth/roles';

import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useNotify } from '../../../components/notify';
import { useJobWriter } from '../hooks/job-writer';
import { statusActions, type StatusAction } from '../utils/job-permissions';
import { JOB_STATUS_TEXT } from '../utils/job-status';
import { saveErrors } from '../utils/save-errors';

const useStyles = makeStyles({
  root: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  button: { minHeight: '48px' },
  body: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
});

type JobStatusActionsProps = { job: JobResponse; analysis: AsBuiltAnalysis; actor: { id: string; role: Role } };

/** The status moves allowed to this person now: start, submit, send back (with a reason), mark ready. */
export function JobStatusActions({ job, analysis, actor }: JobStatusActionsProps) {
  const styles = useStyles();
  const notify = useNotify();
  const writer = useJobWriter();
  const [asking, setAsking] = useState<StatusAction | undefined>();
  const [comment, setComment] = useState('');
  const [error, setError] = useState<string | undefined>();
  const [isPending, setIsPending] = useState(false);
  const actions = statusActions(actor, job);
  if (actions.length === 0) return null;

  const run = async (action: StatusAction) => {
    if (action.needsComment && comment.trim() === '') {
      setError('Say what the crew should change.');
      return;
    }
    setIsPending(true);
    try {
      const outcome = await writer.save({
        endpoint: 'changeStatus',
        params: {},
        body: { to: action.to, ...(action.needsComment ? { comment: comment.trim() } : {}) },
        label: action.label,
      });
      if (outcome === 'saved') notify.success(`${JOB_STATUS_TEXT[action.to]}`, job.title);
      if (outcome === 'queued') notify.success('Waiting for a connection', `"${action.label}" is sent when the phone is back online.`);
      setAsking(undefined);
      setComment('');
      setError(undefined);
    } catch (failure) {
      const { fields, message } = saveErrors(failure);
      setError(fields.comment ?? message);
    } finally {
      setIsPending(false);
    }
  };

  const open = analysis.summary.critical + analysis.summary.warning;
  return (
    <div className={styles.root}>
      {actions.map((action) => (
        <Button
          key={action.to}
          appearance={action.isPrimary ? 'primary' : 'secondary'}
          className={styles.button}
          onClick={() => {
            setError(undefined);
            setAsking(action);
          }}
        >
          {action.label}
        </Button>
      ))}
      <ConfirmDialog
        open={asking !== undefined}
        title={asking ? `${asking.label}?` : ''}
        confirmLabel={asking?.label ?? ''}
        isPending={isPending}
        onConfirm={() => asking && void run(asking)}
        onCancel={() => setAsking(undefined)}
      >
        <div className={styles.body}>
          {asking?.to === 'submitted' && (
            <Text>
              {open === 0
                ? 'The record passes every check. The office reviews it next; you cannot change it until they send it back.'
                : `${open} ${open === 1 ? 'finding is' : 'findings are'} still open. The office reviews the job next; you cannot change it until they send it back.`}
            </Text>
          )}
          {asking?.to === 'ready_to_issue' && <Text>The packet can then be issued to the homeowner.</Text>}
          {asking?.to === 'in_progress' && !asking.needsComment && <Text>The crew can record on this job again.</Text>}
          {asking?.needsComment && (
            <Field label="What should the crew change?" required validationMessage={error}>
              <Textarea value={comment} onChange={(_event, data) => setComment(data.value)} resize="vertical" />
            </Field>
          )}
          {error && !asking?.needsComment && <Text role="alert">{error}</Text>}
        </div>
      </ConfirmDialog>
    </div>
  );
}
