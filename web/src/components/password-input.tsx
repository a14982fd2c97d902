import { Button, Input, type InputProps, makeStyles } from '@fluentui/react-components';
import { Eye20Regular, EyeOff20Regular } from '@fluentui/react-icons';
import { useState } from 'react';

const useStyles = makeStyles({
  toggle: { minWidth: '44px', minHeight: '40px' },
});

/**
 * A password box with a button to show what was typed: on a phone in the sun, seeing the password
 * beats typing it twice.
 */
export function PasswordInput(props: Omit<InputProps, 'type' | 'contentAfter'>) {
  const styles = useStyles();
  const [isVisible, setIsVisible] = useState(false);
  return (
    <Input
      {...props}
      type={isVisible ? 'text' : 'password'}
      contentAfter={
        <Button
          appearance="transparent"
          size="small"
          className={styles.toggle}
          icon={isVisible ? <EyeOff20Regular /> : <Eye20Regular />}
          aria-label={isVisible ? 'Hide password' : 'Show password'}
          aria-pressed={isVisible}
          onClick={() => setIsVisible((visible) => !visible)}
        />
      }
    />
  );
}
