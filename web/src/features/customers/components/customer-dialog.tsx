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
  Input,
  makeStyles,
  Textarea,
  tokens,
} from '@fluentui/react-components';
import { Add20Regular, Edit20Regular } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { CreateCustomerSchema, type CustomerResponse } from '@domain/customers/customer.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useSaveCustomer } from '../api/save-customer';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  control: { minHeight: '48px' },
});

type Field = 'name' | 'email' | 'phone' | 'notes';

/** New customer, or change one (`customer` given): name, e-mail, phone, notes. */
export function CustomerDialog({ customer, onSaved }: { customer?: CustomerResponse; onSaved?: (customer: CustomerResponse) => void }) {
  const styles = useStyles();
  const notify = useNotify();
  const save = useSaveCustomer();
  const [open, setOpen] = useState(false);
  const [values, setValues] = useState({ name: customer?.name ?? '', email: customer?.email ?? '', phone: customer?.phone ?? '', notes: customer?.notes ?? '' });
  const [errors, setErrors] = useState<FieldErrors<Field>>({});
  const set = (key: Field, value: string) => setValues((current) => ({ ...current, [key]: value }));

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const orNull = (value: string) => (value.trim() === '' ? null : value);
    const parsed = CreateCustomerSchema.safeParse({ name: values.name, email: orNull(values.email), phone: orNull(values.phone), notes: orNull(values.notes) });
    if (!parsed.success) {
      setErrors(fieldErrorsFromZod<Field>(parsed.error));
      return;
    }
    setErrors({});
    save.mutate(
      { id: customer?.id, input: parsed.data },
      {
        onSuccess: (saved) => {
          notify.success(customer ? 'Customer saved' : 'Customer added', saved.name);
          setOpen(false);
          onSaved?.(saved);
        },
        onError: (error) => {
          const found = fieldErrorsFromApi<Field>(error);
          if (Object.keys(found).length === 0) notify.error('Could not save the customer', describeRequestError(error));
          setErrors(found);
        },
      },
    );
  };

  return (
    <Dialog open={open} onOpenChange={(_e, d) => !save.isPending && setOpen(d.open)}>
      <DialogTrigger disableButtonEnhancement>
        <Button appearance={customer ? 'secondary' : 'primary'} className={styles.control} icon={customer ? <Edit20Regular /> : <Add20Regular />}>
          {customer ? 'Change customer' : 'New customer'}
        </Button>
      </DialogTrigger>
      <DialogSurface>
        <form onSubmit={submit} noValidate>
          <DialogBody>
            <DialogTitle>{customer ? `Change ${customer.name}` : 'New customer'}</DialogTitle>
            <DialogContent className={styles.form}>
              <Field label="Name" required validationMessage={errors.name}>
                <Input className={styles.control} value={values.name} onChange={(_e, d) => set('name', d.value)} />
              </Field>
              <Field label="E-mail" validationMessage={errors.email}>
                <Input className={styles.control} type="email" inputMode="email" value={values.email} onChange={(_e, d) => set('email', d.value)} />
              </Field>
              <Field label="Phone" validationMessage={errors.phone}>
                <Input className={styles.control} type="tel" inputMode="tel" value={values.phone} onChange={(_e, d) => set('phone', d.value)} />
              </Field>
              <Field label="Notes" validationMessage={errors.notes}>
                <Textarea value={values.notes} onChange={(_e, d) => set('notes', d.value)} />
              </Field>
            </DialogContent>
            <DialogActions fluid>
              <DialogTrigger disableButtonEnhancement>
                <Button className={styles.control}>Cancel</Button>
              </DialogTrigger>
              <Button type="submit" appearance="primary" className={styles.control} disabled={save.isPending}>
                Save
              </Button>
            </DialogActions>
          </DialogBody>
        </form>
      </DialogSurface>
    </Dialog>
  );
}
