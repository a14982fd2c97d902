import { Badge, Button, Input, makeStyles, MessageBar, MessageBarBody, Spinner, Text, tokens } from '@fluentui/react-components';
import { useEffect, useMemo, useState } from 'react';
import type { CompanyDepthRulesResponse } from '@domain/company/company-profile.schema';
import type { DepthRule } from '@domain/depth/depth-rules.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError } from '../../../lib/form-errors';
import { formatLength, lengthInputValue, parseLength, unitLabel } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { LOCATION_LABELS, METHOD_LABELS } from '../../job-record';
import { useResetDepthRules } from '../api/reset-depth-rules';
import { useUpdateDepthRules } from '../api/update-depth-rules';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalM },
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalS },
  rule: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) 8rem',
    gap: tokens.spacingHorizontalM,
    alignItems: 'center',
    padding: `${tokens.spacingVerticalS} 0`,
    borderBottom: `1px solid ${tokens.colorNeutralStroke2}`,
  },
  name: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXXS },
  // The field's box is 48 px so the text box inside it (2 px of border less) is a 44 px target too.
  input: { minHeight: '48px', width: '100%' },
  muted: { color: tokens.colorNeutralForeground2 },
  error: { color: tokens.colorPaletteRedForeground1 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  button: { minHeight: '48px' },
});

const BASIS_LABELS: Record<DepthRule['basis'], string> = { code: 'Code table', common_practice: 'Common practice', company: 'Company rule' };

/** One rule per method × location × circuit class (the domain's table holds at most one of each). */
const keyOf = (rule: Pick<DepthRule, 'method' | 'location' | 'circuit'>) => `${rule.method}/${rule.location}/${rule.circuit ?? 'any'}`;

/** Which circuits a rule is for, in the words of the trade (NEC Table 300.5 parts column 5 off at 30 V). */
const CIRCUIT_LABELS: Record<NonNullable<DepthRule['circuit']>, string> = {
  up_to_30v: 'circuits up to 30 V',
  over_30v: 'circuits over 30 V (70 V and 100 V lines)',
};

type DepthRulesEditorProps = { rules: CompanyDepthRulesResponse; canChange: boolean };

/**
 * The depth rules the findings cite: minimum cover per installation method and location, each with the
 * shipped default and its basis beside it. A changed value becomes a company rule; "Reset to defaults"
 * goes back to the shipped table. Values are typed in the person's units and stored in metres.
 */
export function DepthRulesEditor({ rules, canChange }: DepthRulesEditorProps) {
  const styles = useStyles();
  const notify = useNotify();
  const [units] = useUnitPreferences();
  const update = useUpdateDepthRules();
  const reset = useResetDepthRules();
  const [message, setMessage] = useState<string | undefined>();
  const defaults = useMemo(() => new Map(rules.defaults.rules.map((rule) => [keyOf(rule), rule])), [rules.defaults]);

  const shown = (rule: DepthRule) => (rule.minCoverM === null ? '' : lengthInputValue(rule.minCoverM, units.length, 'short'));
  const [draft, setDraft] = useState<Record<string, string>>(() => Object.fromEntries(rules.table.rules.map((r) => [keyOf(r), shown(r)])));
  useEffect(() => setDraft(Object.fromEntries(rules.table.rules.map((r) => [keyOf(r), shown(r)]))), [rules, units.length]); // eslint-disable-line react-hooks/exhaustive-deps

  const parsed = rules.table.rules.map((rule) => {
    const text = (draft[keyOf(rule)] ?? '').trim();
    if (text === '') return { rule, value: null as number | null, error: undefined as string | undefined };
    const result = parseLength(text, units.length, 'short');
    if (!result.ok) return { rule, value: null, error: result.message };
    if (result.metres > 3) return { rule, value: null, error: 'At most 3 m (10 ft).' };
    return { rule, value: Math.round(result.metres * 10000) / 10000, error: undefined };
  });
  const changed = parsed.filter(({ rule, value, error }) => !error && (draft[keyOf(rule)] ?? '') !== shown(rule) && value !== rule.minCoverM);
  const hasErrors = parsed.some((p) => p.error);

  const save = async () => {
    setMessage(undefined);
    if (hasErrors || changed.length === 0) return;
    const byKey = new Map(changed.map((c) => [keyOf(c.rule), c.value]));
    const table = {
      name: rules.isDefault ? 'Company depth rules (edited from the shipped defaults)' : rules.table.name,
      rules: rules.table.rules.map((rule) => {
        const key = keyOf(rule);
        if (!byKey.has(key)) return rule;
        const value = byKey.get(key)!;
        return {
          ...rule,
          minCoverM: value,
          basis: 'company' as const,
          source:
            value === null
              ? 'Company rule: not checked.'
              : `Company rule: at least ${formatLength(value, units.length, 'short')} of cover. Local codes and the authority having jurisdiction may require more.`,
        };
      }),
    };
    try {
      await update.mutateAsync(table);
      notify.success('Depth rules saved');
    } catch (error) {
      setMessage(describeRequestError(error));
    }
  };

  const resetToDefaults = async () => {
    setMessage(undefined);
    try {
      await reset.mutateAsync();
      notify.success('Depth rules back to the defaults');
    } catch (error) {
      setMessage(describeRequestError(error));
    }
  };

  return (
    <div className={styles.root}>
      <Text className={styles.muted}>
        Minimum cover from the top of the cable or conduit to finished grade. Findings compare each depth reading with these rules. They are your
        company’s standard, not code approval: local codes and the authority having jurisdiction decide.
      </Text>
      <Text weight="semibold">{rules.table.name}</Text>
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      <ul className={styles.list} aria-label="Depth rules">
        {parsed.map(({ rule, error }) => {
          const key = keyOf(rule);
          const fallback = defaults.get(key);
          const label = `${METHOD_LABELS[rule.method]}, ${LOCATION_LABELS[rule.location].toLowerCase()}${rule.circuit ? `, ${CIRCUIT_LABELS[rule.circuit]}` : ''}`;
          return (
            <li key={key} className={styles.rule}>
              <div className={styles.name}>
                <Text weight="semibold">{label}</Text>
                <Text size={200} className={styles.muted}>
                  <Badge appearance="tint" size="small" color={rule.basis === 'company' ? 'brand' : 'informative'}>
                    {BASIS_LABELS[rule.basis]}
                  </Badge>{' '}
                  {fallback
                    ? `Default ${fallback.minCoverM === null ? 'not checked' : formatLength(fallback.minCoverM, units.length, 'short')} (${BASIS_LABELS[fallback.basis].toLowerCase()}): ${fallback.source}`
                    : rule.source}
                </Text>
                {error && (
                  <Text size={200} className={styles.error} role="alert">
                    {error}
                  </Text>
                )}
              </div>
              <Input
                className={styles.input}
                aria-label={`Minimum cover, ${label}`}
                value={draft[key] ?? ''}
                disabled={!canChange}
                placeholder="not checked"
                contentAfter={<Text size={200}>{unitLabel(units.length, 'short')}</Text>}
                onChange={(_e, d) => setDraft((current) => ({ ...current, [key]: d.value }))}
              />
            </li>
          );
        })}
      </ul>
      {canChange && (
        <div className={styles.actions}>
          <Button
            appearance="primary"
            className={styles.button}
            disabled={changed.length === 0 || hasErrors || update.isPending}
            icon={update.isPending ? <Spinner size="tiny" /> : undefined}
            onClick={() => void save()}
          >
            Save depth rules
          </Button>
          <Button className={styles.button} disabled={rules.isDefault || reset.isPending} onClick={() => void resetToDefaults()}>
            Reset to defaults
          </Button>
        </div>
      )}
      {!canChange && <Text className={styles.muted}>Only an admin changes the depth rules.</Text>}
    </div>
  );
}
