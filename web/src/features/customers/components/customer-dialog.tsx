import { Button, makeStyles } from '@fluentui/react-components';
import { Add20Regular, Edit20Regular } from '@fluentui/react-icons';
import { z } from 'zod';
import { CreateCustomerSchema, type CustomerResponse } from '@domain/customers/customer.schema';

import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { blankToNull, describeRequestError } from '../../../lib/form-errors';
import { useCreateCustomer } from '../api/create-customer';
import { useUpdateCustomer } from '../api/update-customer';

const useStyles = makeStyles({
  control: { minHeight: '48px' },
});

const CustomerFormSchema = z
  .object({ name: z.string(), email: blankToNull(), phone: blankToNull(), notes: blankToNull() })
  .pipe(CreateCustomerSchema);

/** New customer, or change one (`customer` given): name, e-mail, phone, notes. */
export function CustomerDialog({ customer, onSaved }: { customer?: CustomerResponse; onSaved?: (customer: CustomerResponse) => void }) {
  const styles = useStyles();
  const notify = useNotify();
  const create = useCreateCustomer();
  const update = useUpdateCustomer();

  return (
    <FormDialog
      trigger={
        <Button appearance={customer ? 'secondary' : 'primary'} className={styles.control} icon={customer ? <Edit20Regular /> : <Add20Regular />}>
          {customer ? 'Change customer' : 'New customer'}
        </Button>
      }
      title={customer ? `Change ${customer.name}` : 'New customer'}
      schema={CustomerFormSchema}
      defaultValues={{ name: customer?.name ?? '', email: customer?.email ?? '', phone: customer?.phone ?? '', notes: customer?.notes ?? '' }}
      isPending={create.isPending || update.isPending}
      onSubmit={(input, { close, showFieldErrors }) => {
        const outcome = {
          onSuccess: (saved: CustomerResponse) => {
            notify.success(customer ? 'Customer saved' : 'Customer added', saved.name);
            close();
            onSaved?.(saved);
          },
          onError: (error: Error) => {
            if (!showFieldErrors(error)) notify.error('Could not save the customer', describeRequestError(error));
          },
        };
        if (customer) update.mutate({ id: customer.id, input }, outcome);
        else create.mutate(input, outcome);
      }}
    >
      {(form, fieldError) => (
        <>
          <FormTextField form={form} name="name" label="Name" required error={fieldError('name')} />
          <FormTextField form={form} name="email" label="E-mail" type="email" inputMode="email" error={fieldError('email')} />
          <FormTextField form={form} name="phone" label="Phone" type="tel" inputMode="tel" error={fieldError('phone')} />
          <FormTextField form={form} name="notes" label="Notes" isMultiline error={fieldError('notes')} />
        </>
      )}
    </FormDialog>
  );
}
