import { Button, Field, Input, Radio, RadioGroup, Select, Spinner, Text } from '@fluentui/react-components';
import { ArrowUndo24Regular, Checkmark24Regular, Delete24Regular, Dismiss24Regular } from '@fluentui/react-icons';
import type { PlanFeature } from '@domain/as-built/as-built.schema';
import { SITE_FEATURE_KIND_LABELS, SITE_FEATURE_KINDS, type SiteFeatureKind, type SiteFeatureShape } from '@domain/sites/site-feature.schema';

import { usePanelStyles } from './panel-styles';

export type FeatureDraft = { featureId: string; kind: SiteFeatureKind; name: string; shape: SiteFeatureShape };

type FeaturePanelProps = {
  features: readonly PlanFeature[];
  draft: FeatureDraft;
  pointCount: number;
  isSaving: boolean;
  error?: string;
  onPick: (featureId: string) => void;
  onChange: (draft: FeatureDraft) => void;
  onUndo: () => void;
  onClearPoints: () => void;
  onSave: () => void;
  onDelete: () => void;
};

/**
 * Landmarks of the site (house, fences, patio …): pick one to change or start a new one, name it, and
 * tap its corners on the plan (points snap to existing corners, reference points and items).
 */
export function FeaturePanel(props: FeaturePanelProps) {
  const { features, draft, pointCount, isSaving, error } = props;
  const styles = usePanelStyles();
  const needed = draft.shape === 'polygon' ? 3 : 2;
  const canSave = draft.name.trim() !== '' && pointCount >= needed && !isSaving;
  return (
    <section className={styles.panel} aria-label="Landmark">
      <Field label="Landmark">
        <Select className={styles.control} value={draft.featureId} onChange={(_e, d) => props.onPick(d.value)}>
          <option value="">New landmark</option>
          {features.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name} ({SITE_FEATURE_KIND_LABELS[f.kind].toLowerCase()})
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Kind">
        <Select className={styles.control} value={draft.kind} onChange={(_e, d) => props.onChange({ ...draft, kind: d.value as SiteFeatureKind })}>
          {SITE_FEATURE_KINDS.map((kind) => (
            <option key={kind} value={kind}>
              {SITE_FEATURE_KIND_LABELS[kind]}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Name" hint="What someone on site calls it: “East fence”, “Back patio”." required>
        <Input className={styles.control} value={draft.name} maxLength={120} onChange={(_e, d) => props.onChange({ ...draft, name: d.value })} />
      </Field>
      <Field label="Shape">
        <RadioGroup layout="horizontal" value={draft.shape} onChange={(_e, d) => props.onChange({ ...draft, shape: d.value as SiteFeatureShape })}>
          <Radio value="polygon" label="Outline" />
          <Radio value="line" label="Line" />
        </RadioGroup>
      </Field>
      <Text>
        {pointCount === 0 ? 'No points yet: tap the corners on the plan.' : `${pointCount} point${pointCount === 1 ? '' : 's'}`}
        {pointCount > 0 && pointCount < needed ? ` (at least ${needed})` : ''}
      </Text>
      {error && <Text className={styles.warning}>{error}</Text>}
      <div className={styles.actions}>
        <Button icon={<ArrowUndo24Regular />} disabled={pointCount === 0 || isSaving} onClick={props.onUndo}>
          Undo point
        </Button>
        <Button icon={<Dismiss24Regular />} disabled={pointCount === 0 || isSaving} onClick={props.onClearPoints}>
          Clear points
        </Button>
        {draft.featureId !== '' && (
          <Button icon={<Delete24Regular />} disabled={isSaving} onClick={props.onDelete}>
            Delete landmark
          </Button>
        )}
        <Button appearance="primary" icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />} disabled={!canSave} onClick={props.onSave}>
          Save landmark
        </Button>
      </div>
    </section>
  );
}
