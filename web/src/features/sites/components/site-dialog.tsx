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
  tokens,
} from '@fluentui/react-components';
import { Add20Regular, Edit20Regular } from '@fluentui/react-icons';
import { useState, type FormEvent } from 'react';
import { CreateSiteSchema, type SiteResponse } from '@domain/sites/site.schema';

import { useNotify } from '../../../components/notify';
import { describeRequestError, fieldErrorsFromApi, fieldErrorsFromZod, type FieldErrors } from '../../../lib/form-errors';
import { useSaveSite } from '../api/save-site';
import { useSiteConflict } from '../hooks/use-site-conflict';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
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
type Key = (typeof FIELDS)[number]['key'];

/** New site for a customer, or change a site's address. */
export function SiteDialog({ customerId, site, onSaved }: { customerId: string; site?: SiteResponse; onSaved?: (site: SiteResponse) => void }) {
  const styles = useStyles();
  const notify = useNotify();
  const save = useSaveSite();
  const conflict = useSiteConflict();
  const [open, setOpen] = useState(false);
  const [values, setValues] = useState<Record<Key, string>>({
    label: site?.label ?? '',
    addressLine1: site?.addressLine1 ?? '',
    addressLine2: site?.addressLine2 ?? '',
    city: site?.city ?? '',
    region: site?.region ?? '',
    postalCode: site?.postalCode ?? '',
    country: site?.country ?? '',
  });
  const [errors, setErrors] = useState<FieldErrors<Key>>({});

  const submit = (event?: FormEvent) => {
    event?.preventDefault();
    const orNull = (value: string) => (value.trim() === '' ? null : value);
    const parsed = CreateSiteSchema.safeParse({
      customerId,
      ...values,
      addressLine2: orNull(values.addressLine2),
      region: orNull(values.region),
      postalCode: orNull(values.postalCode),
    });
    if (!parsed.success) {
      setErrors(fieldErrorsFromZod<Key>(parsed.error));
      return;
    }
    setErrors({});
    save.mutate(
      { id: site?.id, input: parsed.data },
      {
        onSuccess: (saved) => {
          notify.success(site ? 'Site saved' : 'Site added', saved.label);
          setOpen(false);
          onSaved?.(saved);
        },
        onError: (error) => {
          // Someone changed the site meanwhile: keep what was typed, and ask (the form stays open).
          if (site && conflict.handle(error, `the address of ${site.label}`, () => submit())) return;
          const found = fieldErrorsFromApi<Key>(error);
          if (Object.keys(found).length === 0) notify.error('Could not save the site', describeRequestError(error));
          setErrors(found);
        },
      },
    );
  };

  return (
    <Dialog open={open} onOpenChange={(_e, d) => !save.isPending && setOpen(d.open)}>
      <DialogTrigger disableButtonEnhancement>
        <Button appearance={site ? 'secondary' : 'primary'} className={styles.control} icon={site ? <Edit20Regular /> : <Add20Regular />}>
          {site ? 'Change address' : 'New site'}
        </Button>
      </DialogTrigger>
      <DialogSurface>
        <form onSubmit={submit} noValidate>
          <DialogBody>
            <DialogTitle>{site ? `Change ${site.label}` : 'New site'}</DialogTitle>
            <DialogContent className={styles.form}>
              {FIELDS.map((field) => (
                <Field key={field.key} label={field.label} required={field.required} validationMessage={errors[field.key]}>
                  <Input
                    className={styles.control}
                    value={values[field.key]}
                    placeholder={'placeholder' in field ? field.placeholder : undefined}
                    onChange={(_e, d) => setValues((current) => ({ ...current, [field.key]: d.value }))}
                  />
                </Field>
              ))}
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
        {conflict.dialog}
      </DialogSurface>
    </Dialog>
  );
}
