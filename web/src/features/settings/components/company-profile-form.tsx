import { Button, Field, Input, makeStyles, MessageBar, MessageBarBody, Spinner, Text, Textarea, tokens } from '@fluentui/react-components';
import { useEffect, useRef, useState } from 'react';
import type { CompanyProfileResponse, UpdateCompanyProfileInput } from '@domain/company/company-profile.schema';
import { isIanaTimeZone, isSupportedLocale } from '@domain/company/company-profile.schema';

import { useNotify } from '../../../components/notify';
import { isApiError } from '../../../lib/api-client';
import { describeRequestError, toSentence } from '../../../lib/form-errors';
import { useLogoUrl } from '../api/get-logo';
import { useRemoveLogo } from '../api/remove-logo';
import { useUpdateCompanyProfile } from '../api/update-company-profile';
import { useUploadLogo } from '../api/upload-logo';

const useStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  row: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM, alignItems: 'center' },
  logoBox: {
    width: '160px',
    height: '80px',
    display: 'flex',
    alignItems: 'center',
    justifyContent: 'center',
    border: `1px dashed ${tokens.colorNeutralStroke1}`,
    borderRadius: tokens.borderRadiusMedium,
    backgroundColor: tokens.colorNeutralBackground2,
  },
  logo: { maxWidth: '100%', maxHeight: '100%', objectFit: 'contain' },
  button: { minHeight: '48px' },
  // The field's box is 48 px so the text box inside it (2 px of border less) is a 44 px target too.
  input: { minHeight: '48px' },
  muted: { color: tokens.colorNeutralForeground2 },
  hidden: { display: 'none' },
});

/** The form's text fields, as typed; licence numbers one per line. */
type Draft = {
  tradeName: string;
  phone: string;
  email: string;
  website: string;
  postalAddress: string;
  licenceNumbers: string;
  timeZone: string;
  locale: string;
};
type DraftField = keyof Draft;
const FIELDS: DraftField[] = ['tradeName', 'phone', 'email', 'website', 'postalAddress', 'licenceNumbers', 'timeZone', 'locale'];

function toDraft(profile: CompanyProfileResponse): Draft {
  return {
    tradeName: profile.tradeName,
    phone: profile.phone ?? '',
    email: profile.email ?? '',
    website: profile.website ?? '',
    postalAddress: profile.postalAddress ?? '',
    licenceNumbers: profile.licenceNumbers.join('\n'),
    timeZone: profile.timeZone ?? '',
    locale: profile.locale,
  };
}

/** The browser's own time zone, offered when the profile has none. */
function browserTimeZone(): string | undefined {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || undefined;
  } catch {
    return undefined;
  }
}

/** Checks what the server checks, so most mistakes show before saving. */
function checkDraft(draft: Draft): Partial<Record<DraftField, string>> {
  const errors: Partial<Record<DraftField, string>> = {};
  if (draft.tradeName.trim() === '') errors.tradeName = 'Enter the name the company trades under.';
  if (draft.phone.trim() !== '' && !/^[0-9+()\-.\s]*[0-9][0-9+()\-.\s]*$/.test(draft.phone.trim())) errors.phone = 'Use digits, spaces and + ( ) - . only.';
  if (draft.email.trim() !== '' && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(draft.email.trim())) errors.email = 'Enter an e-mail address.';
  if (draft.website.trim() !== '' && !/^https?:\/\/[^\s/]+\.[^\s]+$/i.test(draft.website.trim())) errors.website = 'Start the address with https://';
  if (draft.timeZone.trim() !== '' && !isIanaTimeZone(draft.timeZone.trim())) errors.timeZone = 'Enter a time zone name such as America/Denver.';
  if (!isSupportedLocale(draft.locale.trim())) errors.locale = 'Enter a locale such as en-US or fr-CA.';
  if (draft.licenceNumbers.split('\n').filter((l) => l.trim() !== '').length > 10) errors.licenceNumbers = 'At most 10 licence or registration numbers.';
  return errors;
}

function toInput(draft: Draft, dirty: DraftField[]): UpdateCompanyProfileInput {
  const input: UpdateCompanyProfileInput = {};
  for (const field of dirty) {
    if (field === 'licenceNumbers') {
      input.licenceNumbers = draft.licenceNumbers
        .split('\n')
        .map((line) => line.trim())
        .filter((line) => line !== '');
    } else if (field === 'timeZone') {
      input.timeZone = draft.timeZone.trim() === '' ? null : draft.timeZone.trim();
    } else if (field === 'tradeName' || field === 'locale') {
      input[field] = draft[field].trim();
    } else {
      input[field] = draft[field].trim() === '' ? null : draft[field].trim();
    }
  }
  return input;
}

type CompanyProfileFormProps = { profile: CompanyProfileResponse; canChange: boolean };

/**
 * The company profile: what the packets, the packet e-mails, the homeowner portal and the locate view
 * show about the installer. The admin changes it; the office sees it.
 */
export function CompanyProfileForm({ profile, canChange }: CompanyProfileFormProps) {
  const styles = useStyles();
  const notify = useNotify();
  const update = useUpdateCompanyProfile();
  const uploadLogo = useUploadLogo();
  const removeLogo = useRemoveLogo();
  const logoUrl = useLogoUrl(profile.logo?.url);
  const fileInput = useRef<HTMLInputElement>(null);
  const [draft, setDraft] = useState<Draft>(() => toDraft(profile));
  const [errors, setErrors] = useState<Partial<Record<DraftField, string>>>({});
  const [message, setMessage] = useState<string | undefined>();
  const [logoError, setLogoError] = useState<string | undefined>();
  const suggestedZone = profile.timeZone === null ? browserTimeZone() : undefined;

  // After a save (or someone else's), show what the server has.
  useEffect(() => setDraft(toDraft(profile)), [profile]);

  const saved = toDraft(profile);
  const dirty = FIELDS.filter((field) => draft[field] !== saved[field]);
  const set = (field: DraftField) => (value: string) => {
    setDraft((d) => ({ ...d, [field]: value }));
    setErrors((e) => ({ ...e, [field]: undefined }));
  };

  const save = async () => {
    setMessage(undefined);
    const found = checkDraft(draft);
    setErrors(found);
    if (Object.keys(found).length > 0 || dirty.length === 0) return;
    try {
      await update.mutateAsync(toInput(draft, dirty));
      notify.success('Company profile saved');
    } catch (error) {
      const issues = isApiError(error) ? error.issues.filter((issue) => (FIELDS as string[]).includes(issue.path.split('.')[0]!)) : [];
      setErrors(Object.fromEntries(issues.map((issue) => [issue.path.split('.')[0], toSentence(issue.message)])));
      if (issues.length === 0) setMessage(describeRequestError(error));
    }
  };

  const onLogoChosen = async (file: File | undefined) => {
    setLogoError(undefined);
    if (!file) return;
    try {
      await uploadLogo.mutateAsync(file);
      notify.success('Logo saved');
    } catch (error) {
      setLogoError(isApiError(error) && error.issues[0] ? toSentence(error.issues[0].message) : describeRequestError(error));
    } finally {
      if (fileInput.current) fileInput.current.value = '';
    }
  };

  const text = (field: DraftField, label: string, props: { hint?: string; type?: 'tel' | 'email' | 'url' | 'text'; autoComplete?: string; required?: boolean } = {}) => (
    <Field label={label} hint={props.hint} required={props.required} validationMessage={errors[field]}>
      <Input
        className={styles.input}
        type={props.type ?? 'text'}
        autoComplete={props.autoComplete}
        value={draft[field]}
        disabled={!canChange}
        onChange={(_e, d) => set(field)(d.value)}
      />
    </Field>
  );

  return (
    <form
      className={styles.form}
      aria-label="Company profile"
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        void save();
      }}
    >
      {message && (
        <MessageBar intent="error" layout="multiline">
          <MessageBarBody>{message}</MessageBarBody>
        </MessageBar>
      )}
      {!canChange && <Text className={styles.muted}>Only an admin changes the company profile.</Text>}

      <Field label="Logo" hint="PNG, JPEG or WebP, at most 5 MB. Printed on the packet cover; packets already issued keep theirs." validationMessage={logoError}>
        <div className={styles.row}>
          <div className={styles.logoBox}>
            {logoUrl ? <img className={styles.logo} src={logoUrl} alt={`${profile.tradeName} logo`} /> : <Text className={styles.muted}>No logo</Text>}
          </div>
          {canChange && (
            <>
              <input
                ref={fileInput}
                className={styles.hidden}
                type="file"
                accept="image/png,image/jpeg,image/webp"
                data-testid="logo-input"
                onChange={(event) => void onLogoChosen(event.target.files?.[0])}
              />
              <Button className={styles.button} disabled={uploadLogo.isPending} icon={uploadLogo.isPending ? <Spinner size="tiny" /> : undefined} onClick={() => fileInput.current?.click()}>
                {profile.logo ? 'Replace logo' : 'Upload logo'}
              </Button>
              {profile.logo && (
                <Button className={styles.button} disabled={removeLogo.isPending} onClick={() => void removeLogo.mutateAsync().then(() => notify.success('Logo removed'))}>
                  Remove logo
                </Button>
              )}
            </>
          )}
        </div>
      </Field>

      {text('tradeName', 'Trade name', { hint: 'The name homeowners know you by: packet cover, e-mail sender, portal, locate view.', autoComplete: 'organization', required: true })}
      {text('phone', 'Phone', { hint: 'Printed in every packet footer and on the locate page so a digger can call before digging.', type: 'tel', autoComplete: 'tel' })}
      {canChange && draft.phone.trim() === '' && (
        <MessageBar intent="warning" layout="multiline">
          <MessageBarBody>Without a phone number, packets carry no number to call before digging near the cables.</MessageBarBody>
        </MessageBar>
      )}
      {text('email', 'E-mail', { hint: 'Replies to packet e-mails go here.', type: 'email', autoComplete: 'email' })}
      {text('website', 'Website', { type: 'url', autoComplete: 'url' })}
      <Field label="Postal address" validationMessage={errors.postalAddress}>
        <Textarea value={draft.postalAddress} disabled={!canChange} resize="vertical" rows={3} onChange={(_e, d) => set('postalAddress')(d.value)} />
      </Field>
      <Field label="Licence and registration numbers" hint="One per line, as they should print." validationMessage={errors.licenceNumbers}>
        <Textarea value={draft.licenceNumbers} disabled={!canChange} resize="vertical" rows={2} onChange={(_e, d) => set('licenceNumbers')(d.value)} />
      </Field>
      <Field label="Time zone" hint="An IANA name such as America/Denver; dates on packets follow it." validationMessage={errors.timeZone}>
        <div className={styles.row}>
          <Input className={styles.input} value={draft.timeZone} disabled={!canChange} onChange={(_e, d) => set('timeZone')(d.value)} placeholder={suggestedZone} />
          {canChange && suggestedZone && draft.timeZone.trim() === '' && (
            <Button className={styles.button} onClick={() => set('timeZone')(suggestedZone)}>
              Use this device’s zone ({suggestedZone})
            </Button>
          )}
        </div>
      </Field>
      {text('locale', 'Dates and numbers', { hint: 'A locale such as en-US (the default), en-CA or fr-CA.' })}

      {canChange && (
        <div className={styles.row}>
          <Button
            type="submit"
            appearance="primary"
            className={styles.button}
            disabled={dirty.length === 0 || update.isPending}
            icon={update.isPending ? <Spinner size="tiny" /> : undefined}
          >
            Save company profile
          </Button>
          {dirty.length > 0 && (
            <Button className={styles.button} disabled={update.isPending} onClick={() => setDraft(saved)}>
              Undo changes
            </Button>
          )}
        </div>
      )}
    </form>
  );
}
