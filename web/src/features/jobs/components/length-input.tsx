import { Field, Input, makeStyles, Text, tokens } from '@fluentui/react-components';

import { formatLength, parseLength, unitLabel, type LengthScale } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';

const useStyles = makeStyles({
  input: { minHeight: '48px', fontSize: tokens.fontSizeBase400, width: '100%', minWidth: 0 },
  unit: { color: tokens.colorNeutralForeground2, paddingInlineEnd: tokens.spacingHorizontalXS },
});

type LengthInputProps = {
  id: string;
  label: string;
  value: string;
  onChange: (value: string) => void;
  scale: LengthScale;
  required?: boolean;
  error?: string;
  hint?: string;
  inputRef?: React.Ref<HTMLInputElement>;
};

/**
 * A length typed in the user's units (a bare number in the field's unit, or with units: `6 in`,
 * `0.15 m`, `2' 6"`, `18 6`, `4 1/4`); shows what it was read as. Imperial users get the phone's text
 * keyboard (it has ' and "), metric users the decimal keypad.
 */
export function LengthInput({ id, label, value, onChange, scale, required, error, hint, inputRef }: LengthInputProps) {
  const styles = useStyles();
  const [units] = useUnitPreferences();
  const parsed = value.trim() === '' ? undefined : parseLength(value, units.length, scale, label);
  // Say what a value with units or fractions was read as, so `18 6` is seen to mean 18 ft 6 in.
  const readAs =
    parsed?.ok && /[a-z'"″′’”/¼½¾⅛⅜⅝⅞ ]/i.test(value.trim()) ? `Read as ${formatLength(parsed.metres, units.length, scale)}` : undefined;
  return (
    <Field label={label} required={required} validationMessage={error} hint={error ? undefined : (readAs ?? hint)}>
      <Input
        id={id}
        ref={inputRef}
        className={styles.input}
        // Feet and inches need ' and " and a space, which a phone's decimal keypad lacks.
        inputMode={units.length === 'imperial' ? 'text' : 'decimal'}
        enterKeyHint="next"
        autoCapitalize="off"
        autoCorrect="off"
        spellCheck={false}
        autoComplete="off"
        value={value}
        onChange={(_event, data) => onChange(data.value)}
        contentAfter={<Text className={styles.unit}>{unitLabel(units.length, scale)}</Text>}
      />
    </Field>
  );
}

/** Parses a length field for saving: metres, or the message to show under it. */
export function readLength(
  value: string,
  units: { length: 'imperial' | 'metric' },
  scale: LengthScale,
  field?: string,
): { metres?: number; error?: string } {
  const parsed = parseLength(value, units.length, scale, field);
  return parsed.ok ? { metres: parsed.metres } : { error: parsed.message };
}
