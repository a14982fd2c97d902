import { Button, Field, makeStyles, MessageBar, MessageBarBody, Text, Textarea, tokens } from '@fluentui/react-components';
import { DocumentArrowUp20Regular } from '@fluentui/react-icons';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { z } from 'zod';
import type { Finding } from '@domain/analysis/finding';
import { FINDING_SEVERITY_LABELS, findingText } from '@domain/analysis/finding';
import { findingKey, IssuePacketBodySchema, MAX_ACKNOWLEDGEMENT_REASON_CHARS } from '@domain/packet/known-exceptions';

import { FormDialog } from '../../../components/form-dialog';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError } from '../../../lib/form-errors';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { type IssuePacketResponse, useIssuePacket } from '../api/issue-packet';

/** As the API (FindingAcknowledgementSchema): a reason of at least 3 characters once trimmed. */
const MIN_REASON = 3;
const REASON_NEEDED = 'Give a reason of at least 3 characters.';

const useStyles = makeStyles({
  surface: { maxWidth: 'min(640px, calc(100vw - 24px))' },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  finding: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS, overflowWrap: 'anywhere' },
  severity: { fontWeight: tokens.fontWeightSemibold },
  action: { minHeight: '44px' },
});

const hasReason = (reason: string) => reason.trim().length >= MIN_REASON;

/**
 * One entry per open finding group as the form holds it; the request carries the entries with a reason
 * (every must-fix one needs it), as the shared IssuePacketBodySchema has them.
 */
const IssuePacketFormSchema = z
  .object({
    findings: z.array(
      z
        .object({ key: z.string(), code: z.string(), path: z.string(), isMustFix: z.boolean(), reason: z.string() })
        .refine((entry) => !entry.isMustFix || hasReason(entry.reason), { error: REASON_NEEDED, path: ['reason'] }),
    ),
  })
  .transform(({ findings }): z.input<typeof IssuePacketBodySchema> => ({
    acknowledgements: findings.filter((entry) => hasReason(entry.reason)).map(({ code, path, reason }) => ({ code, path, reason: reason.trim() })),
  }))
  .pipe(IssuePacketBodySchema);
type IssuePacketForm = z.input<typeof IssuePacketFormSchema>;

const missingReasons = (values: IssuePacketForm) => values.findings.filter((entry) => entry.isMustFix && !hasReason(entry.reason)).length;

type IssuePacketDialogProps = {
  jobId: string;
  jobVersion: number;
  /** The job's findings as the workspace shows them (notes are not asked about). */
  findings: readonly Finding[];
};

/**
 * "Issue packet" with a confirmation step: the open findings are shown; each must-fix finding needs a
 * short reason (it then prints in the packet as a known exception in the homeowner's words); a finding
 * to check may be given a reason too, to list it the same way.
 */
export function IssuePacketDialog({ jobId, jobVersion, findings }: IssuePacketDialogProps) {
  const styles = useStyles();
  const [units] = useUnitPreferences();
  const issue = useIssuePacket(jobId);
  const [issued, setIssued] = useState<IssuePacketResponse | undefined>();

  // One entry per code and path: findings that share them (two channels of one amplifier) are acknowledged together.
  const groups = new Map<string, Finding[]>();
  for (const f of findings) if (f.severity !== 'info') groups.set(findingKey(f), [...(groups.get(findingKey(f)) ?? []), f]);
  const entries = [...groups.entries()].map(([key, list]) => ({
    key,
    code: list[0]!.code,
    path: list[0]!.path.join('.'),
    isMustFix: list.some((f) => f.severity === 'critical'),
    reason: '',
  }));
  entries.sort((a, b) => Number(b.isMustFix) - Number(a.isMustFix));

  return (
    <FormDialog
      trigger={
        <Button appearance="primary" className={styles.action} icon={<DocumentArrowUp20Regular />}>
          Issue packet
        </Button>
      }
      title="Issue the handover packet?"
      schema={IssuePacketFormSchema}
      defaultValues={{ findings: entries }}
      isPending={issue.isPending}
      submitLabel={(values) => {
        const missing = missingReasons(values);
        return missing > 0 ? `Give ${missing} reason${missing === 1 ? '' : 's'} to issue` : 'Issue revision';
      }}
      isSubmitDisabled={(values) => missingReasons(values) > 0}
      surfaceClassName={styles.surface}
      onOpenChange={(open) => {
        if (open) {
          setIssued(undefined);
          issue.reset();
        }
      }}
      view={
        issued && {
          title: `Revision ${issued.revision} issued`,
          content: (
            <>
              <Text>The PDF is rendering now; follow it under “Handover packet”.</Text>
              {issued.warnings?.map((warning) => (
                <MessageBar key={warning.code} intent="warning" layout="multiline">
                  <MessageBarBody>{warning.message}</MessageBarBody>
                </MessageBar>
              ))}
            </>
          ),
        }
      }
      onSubmit={async ({ acknowledgements }, { close, showMessage, form }) => {
        try {
          const result = await issue.mutateAsync({ version: jobVersion, acknowledgements });
          if ((result.warnings?.length ?? 0) > 0) setIssued(result);
          else close();
        } catch (error) {
          // A refused acknowledgement is named by its place in the request (`acknowledgements.1`): put it under its reason.
          const sentAt = form.getValues('findings').flatMap((entry, at) => (hasReason(entry.reason) ? [at] : []));
          for (const problem of isApiError(error) ? error.issues : []) {
            const index = /^acknowledgements\.(\d+)/.exec(problem.path)?.[1];
            const at = index === undefined ? undefined : sentAt[Number(index)];
            if (at !== undefined) form.setError(`findings.${at}.reason`, { message: problem.message });
          }
          showMessage(describeRequestError(error));
        }
      }}
    >
      {(form, fieldError) => {
        const values = form.watch('findings');
        return (
          <>
            <Text>Issuing freezes the job as recorded into the next revision and marks the job issued. Later changes need a new revision.</Text>
            {values.length === 0 ? (
              <Text>There are no open findings.</Text>
            ) : (
              <>
                <Text>
                  Give a short reason for each finding marked “{FINDING_SEVERITY_LABELS.critical}”. Each finding with a reason is listed in the
                  packet as a known exception, in plain words for the homeowner.
                </Text>
                <ul className={styles.list} aria-label="Open findings">
                  {values.map((entry, index) => (
                    <li key={entry.key} className={styles.finding}>
                      <Text className={styles.severity}>{FINDING_SEVERITY_LABELS[entry.isMustFix ? 'critical' : 'warning']}</Text>
                      {(groups.get(entry.key) ?? []).map((f, i) => (
                        <Text key={i}>{findingText(f, units.length)}</Text>
                      ))}
                      <Controller
                        control={form.control}
                        name={`findings.${index}.reason`}
                        render={({ field }) => (
                          <Field
                            label={entry.isMustFix ? 'Reason (required)' : 'Reason (optional: lists it in the packet)'}
                            required={entry.isMustFix}
                            validationMessage={fieldError(`findings.${index}.reason`)}
                          >
                            <Textarea
                              ref={field.ref}
                              name={field.name}
                              value={field.value}
                              maxLength={MAX_ACKNOWLEDGEMENT_REASON_CHARS}
                              resize="vertical"
                              onChange={(_event, data) => field.onChange(data.value)}
                              onBlur={field.onBlur}
                            />
                          </Field>
                        )}
                      />
                    </li>
                  ))}
                </ul>
              </>
            )}
          </>
        );
      }}
    </FormDialog>
  );
}
