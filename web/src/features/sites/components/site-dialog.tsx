import { Button, makeStyles } from '@fluentui/react-components';
import { Add20Regular, Edit20Regular } from '@fluentui/react-icons';
import { useMemo } from 'react';
import { z } from 'zod';
import { CreateSiteSchema, type SiteResponse } from '@domain/sites/site.schema';

import { FormDialog, FormTextField } from '../../../components/form-dialog';
import { useNotify } from '../../../components/notify';
import { blankToNull, describeRequestError } from '../../../lib/form-errors';
import { useCreateSite } from '../api/create-site';
import { useUpdateSite } from '../api/update-site';
import { useSiteConflict } from '../hooks/use-site-conflict';

const useStyles = makeStyles({
  control: { minHeight: '48px' },
});

const FIELDS = [
  { key: 'label', label: 'Name of the site', required: true, placeholder: 'Back garden' },
  { key: 'addressLine1', label: 'Address', required: true },
  { key: 'addressLine2', label: 'Address line 2', required: false },
  { key: 'city', label: 'Town or city', required: true },
  { key: 'region', label: 'State or region', required: false },
  { key: 'postalCode', label: 'Postal code', required: false },
  { key: 'country', label: 'Country', required: true },
] as const;

/** The address form of a customer's site: blank optional lines are "none"; then the shared schema. */
function siteFormSchema(customerId: string) {
  return z
    .object({
      label: z.string(),
      addressLine1: z.string(),
      addressLine2: blankToNull(),
      city: z.string(),
      region: blankToNull(),
      postalCode: blankToNull(),
      country: z.string(),
    })
    .transform((values) => ({ ...values, customerId }))
    .pipe(CreateSiteSchema);
}

/** New site for a customer, or change a site's address. */
export function SiteDialog({ customerId, site, onSaved }: { customerId: string; site?: SiteResponse; onSaved?: (site: SiteResponse) => void }) {
  const styles = useStyles();
  const notify = useNotify();
  const create = useCreateSite();
  const update = useUpdateSite();
  const conflict = useSiteConflict();
  const schema = useMemo(() => siteFormSchema(customerId), [customerId]);

  return (
    <FormDialog
      trigger={
        <Button appearance={site ? 'secondary' : 'primary'} className={styles.control} icon={site ? <Edit20Regular /> : <Add20Regular />}>
          {site ? 'Change address' : 'New site'}
        </Button>
      }
      title={site ? `Change ${site.label}` : 'New site'}
      schema={schema}
      defaultValues={{
        label: site?.label ?? '',
        addressLine1: site?.addressLine1 ?? '',
        addressLine2: site?.addressLine2 ?? '',
        city: site?.city ?? '',
        region: site?.region ?? '',
        postalCode: site?.postalCode ?? '',
        country: site?.country ?? '',
      }}
      isPending={create.isPending || update.isPending}
      after={conflict.dialog}
      onSubmit={(input, { close, showFieldErrors, submitAgain }) => {
        const outcome = {
          onSuccess: (saved: SiteResponse) => {
            notify.success(site ? 'Site saved' : 'Site added', saved.label);
            close();
            onSaved?.(saved);
          },
          onError: (error: Error) => {
            // Someone changed the site meanwhile: keep what was typed, and ask (the form stays open).
            if (site && conflict.handle(error, `the address of ${site.label}`, submitAgain)) return;
            if (!showFieldErrors(error)) notify.error('Could not save the site', describeRequestError(error));
          },
        };
        if (site) update.mutate({ id: site.id, input }, outcome);
        else create.mutate(input, outcome);
      }}
    >
      {(form, fieldError) =>
        FIELDS.map((field) => (
          <FormTextField
            key={field.key}
            form={form}
            name={field.key}
            label={field.label}
            required={field.required}
            placeholder={'placeholder' in field ? field.placeholder : undefined}
            error={fieldError(field.key)}
          />
        ))
      }
    </FormDialog>
  );
}
