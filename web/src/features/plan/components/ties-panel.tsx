import { Button, Field, Select, Spinner, Text } from '@fluentui/react-components';
import { Checkmark24Regular } from '@fluentui/react-icons';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { TieSolution } from '@domain/geometry/ties';

import { TiesEditor } from '../../jobs';
import { ITEM_KIND_LABELS } from '../../job-record';
import { tieableItems, type TieDraft } from '../utils/plan-records';

import { usePanelStyles } from './panel-styles';

type TiesPanelProps = {
  asBuilt: AsBuilt;
  itemId: string;
  onItemChange: (itemId: string) => void;
  ties: TieDraft[];
  sideHint: '' | 'left' | 'right';
  onChange: (ties: TieDraft[], sideHint: '' | 'left' | 'right') => void;
  solution: TieSolution | undefined;
  hasDraft: boolean;
  isSaving: boolean;
  error?: string;
  onSave: () => void;
  onDiscard: () => void;
};

/**
 * Place an item from taped ties: the workspace's ties editor (the same solver as the analysis), with
 * the solved position and its accuracy circle drawn live on the plan.
 */
export function TiesPanel(props: TiesPanelProps) {
  const { asBuilt, itemId, ties, sideHint, solution, hasDraft, isSaving } = props;
  const styles = usePanelStyles();
  const items = tieableItems(asBuilt);
  return (
    <section className={styles.panel} aria-label="Place by ties">
      <Field label="Item to place">
        <Select className={styles.control} value={itemId} onChange={(_e, d) => props.onItemChange(d.value)}>
          <option value="">Choose an item</option>
          {items.map((item) => (
            <option key={item.id} value={item.id}>
              {item.label} ({ITEM_KIND_LABELS[item.kind].toLowerCase()})
            </option>
          ))}
        </Select>
      </Field>
      {itemId !== '' && (
        <>
          <TiesEditor recordId={`plan-${itemId}`} referencePoints={asBuilt.referencePoints} ties={ties} sideHint={sideHint} onChange={props.onChange} error={props.error} />
          {hasDraft && <Text className={styles.warning}>Not saved yet: the ties are kept on this device until you save them.</Text>}
          <div className={styles.actions}>
            <Button
              appearance="primary"
              className={styles.button}
              icon={isSaving ? <Spinner size="tiny" /> : <Checkmark24Regular />}
              disabled={!solution?.ok || isSaving}
              onClick={props.onSave}
            >
              Save position
            </Button>
            {hasDraft && (
              <Button appearance="subtle" className={styles.button} disabled={isSaving} onClick={props.onDiscard}>
                Discard changes
              </Button>
            )}
          </div>
        </>
      )}
    </section>
  );
}
