import { Button, Spinner } from '@fluentui/react-components';

import { useFormStyles } from '../../../components/form-styles';

type FormActionsProps = {
  submitLabel: string;
  isSaving: boolean;
  /** With unsaved input kept as a draft, Cancel says it throws that input away. */
  hasDraft: boolean;
  /** Drops the draft and closes the form. */
  onCancel: () => void;
};

/** The Save and Cancel (or Discard changes) row at the foot of a record form; big targets for a phone. */
export function FormActions({ submitLabel, isSaving, hasDraft, onCancel }: FormActionsProps) {
  const styles = useFormStyles();
  return (
    <div className={styles.actions}>
      <Button type="submit" appearance="primary" className={styles.bigButton} disabled={isSaving} icon={isSaving ? <Spinner size="tiny" /> : undefined}>
        {submitLabel}
      </Button>
      <Button className={styles.bigButton} disabled={isSaving} onClick={onCancel}>
        {hasDraft ? 'Discard changes' : 'Cancel'}
      </Button>
    </div>
  );
}
