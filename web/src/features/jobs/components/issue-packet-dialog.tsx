import {
  Button,
  Dialog,
  DialogActions,
  DialogBody,
  DialogContent,
  DialogSurface,
  DialogTitle,
  DialogTrigger,
  Field,
  makeStyles,
  MessageBar,
  MessageBarBody,
  Spinner,
  Text,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { DocumentArrowUp20Regular } from '@fluentui/react-icons';
import type { Finding } from '@domain/analysis/finding';
import { FINDING_SEVERITY_LABELS, findingText } from '@domain/analysis/finding';
import { useState } from 'react';

import { describeRequestError } from '../../../lib/form-errors';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { type FindingAcknowledgement, type IssuePacketResponse, useIssuePacket } from '../api/issue-packet';

/** As the API: at least 3 characters, at most 300. */
const MIN_REASON = 3;
const MAX_REASON = 300;

const useStyles = makeStyles({
  surface: { maxWidth: 'min(640px, calc(100vw - 24px))' },
  content: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  finding: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, overflowWrap: 'anywhere' },
  severity: { fontWeight: tokens.fontWeightSemibold },
  action: { minHeight: '44px' },
  failed: { color: tokens.colorPaletteRedForeground1 },
});

type IssuePacketDialogProps = {
  jobId: string;
  jobVersion: number;
  /** The job's findings as the workspace shows them (notes are not asked about). */
  findings: readonly Finding[];
};

const keyOf = (f: Finding) => `${f.code}@${f.path.join('.')}`;

/**
 * "Issue packet" with a confirmation step: the open findings are shown; each must-fix finding needs a
 * short reason (it then prints in the packet as a known exception in the homeowner's words); a finding
 * to check may be given a reason too, to list it the same way.
 */
export function IssuePacketDialog({ jobId, jobVersion, findings }: IssuePacketDialogProps) {
  const styles = useStyles();
  const [units] = useUnitPreferences();
  const [open, setOpen] = useState(false);
  const issue = useIssuePacket(jobId);
  const [reasons, setReasons] = useState<Record<string, string>>({});
  const [issued, setIssued] = useState<IssuePacketResponse | undefined>();

  // One entry per code and path: findings that share them (two channels of one amplifier) are acknowledged together.
  const open_ = new Map<string, Finding[]>();
  for (const f of findings) if (f.severity !== 'info') open_.set(keyOf(f), [...(open_.get(keyOf(f)) ?? []), f]);
  const groups = [...open_.entries()].map(([key, list]) => ({
    key,
    findings: list,
    isMustFix: list.some((f) => f.severity === 'critical'),
  }));
  groups.sort((a, b) => Number(b.isMustFix) - Number(a.isMustFix));
  const reasonOf = (key: string) => (reasons[key] ?? '').trim();
  const missing = groups.filter((g) => g.isMustFix && reasonOf(g.key).length < MIN_REASON);

  const submit = async () => {
    const acknowledgements: FindingAcknowledgement[] = groups
      .filter((g) => reasonOf(g.key).length >= MIN_REASON)
      .map((g) => ({ code: g.findings[0]!.code, path: g.findings[0]!.path.join('.'), reason: reasonOf(g.key) }));
    try {
      const result = await issue.mutateAsync({ version: jobVersion, acknowledgements });
      if ((result.warnings?.length ?? 0) > 0) setIssued(result);
      else setOpen(false);
    } catch {
      // Shown below from issue.error.
    }
  };

  return (
    <Dialog
      open={open}
      onOpenChange={(_event, data) => {
        setOpen(data.open);
        if (data.open) {
          setIssued(undefined);
          issue.reset();
        }
      }}
    >
      <DialogTrigger disableButtonEnhancement>
        <Button appearance="primary" className={styles.action} icon={<DocumentArrowUp20Regular />}>
          Issue packet
        </Button>
      </DialogTrigger>
      <DialogSurface className={styles.surface}>
        <DialogBody>
          <DialogTitle>{issued ? `Revision ${issued.revision} issued` : 'Issue the handover packet?'}</DialogTitle>
          <DialogContent className={styles.content}>
            {issued ? (
              <>
                <Text>The PDF is rendering now; follow it under “Handover packet”.</Text>
                {issued.warnings?.map((warning) => (
                  <MessageBar key={warning.code} intent="warning" layout="multiline">
                    <MessageBarBody>{warning.message}</MessageBarBody>
                  </MessageBar>
                ))}
              </>
            ) : (
              <>
                <Text>
                  Issuing freezes the job as recorded into the next revision and marks the job issued. Later changes need a new revision.
                </Text>
                {groups.length === 0 ? (
                  <Text>There are no open findings.</Text>
                ) : (
                  <>
                    <Text>
                      Give a short reason for each finding marked “{FINDING_SEVERITY_LABELS.critical}”. Each finding with a reason is listed in
                      the packet as a known exception, in plain words for the homeowner.
                    </Text>
                    <ul className={styles.list} aria-label="Open findings">
                      {groups.map((g) => (
                        <li key={g.key} className={styles.finding}>
                          <Text className={styles.severity}>{FINDING_SEVERITY_LABELS[g.isMustFix ? 'critical' : 'warning']}</Text>
                          {g.findings.map((f, i) => (
                            <Text key={i}>{findingText(f, units.length)}</Text>
                          ))}
                          <Field
                            label={g.isMustFix ? 'Reason (required)' : 'Reason (optional: lists it in the packet)'}
                            required={g.isMustFix}
                            validationMessage={
                              g.isMustFix && issue.isError && reasonOf(g.key).length < MIN_REASON ? 'Give a reason of at least 3 characters.' : undefined
                            }
                          >
                            <Textarea
                              value={reasons[g.key] ?? ''}
                              maxLength={MAX_REASON}
                              resize="vertical"
                              onChange={(_event, data) => setReasons((current) => ({ ...current, [g.key]: data.value }))}
                            />
                          </Field>
                        </li>
                      ))}
                    </ul>
                  </>
                )}
                {issue.isError && <Text className={styles.failed}>{describeRequestError(issue.error)}</Text>}
              </>
            )}
          </DialogContent>
          <DialogActions>
            {issued ? (
              <Button appearance="primary" className={styles.action} onClick={() => setOpen(false)}>
                Close
              </Button>
            ) : (
              <>
                <DialogTrigger disableButtonEnhancement>
                  <Button className={styles.action}>Cancel</Button>
                </DialogTrigger>
                <Button
                  appearance="primary"
                  className={styles.action}
                  disabled={issue.isPending || missing.length > 0}
                  icon={issue.isPending ? <Spinner size="tiny" /> : undefined}
                  onClick={() => void submit()}
                >
                  {missing.length > 0 ? `Give ${missing.length} reason${missing.length === 1 ? '' : 's'} to issue` : 'Issue revision'}
                </Button>
              </>
            )}
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
