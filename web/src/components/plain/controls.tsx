import { type ButtonHTMLAttributes, type ReactNode, useId } from 'react';

import styles from './controls.module.css';

type PlainButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  /** Drawn before the label (or alone: then give the button an `aria-label`). */
  icon?: ReactNode;
  /** `subtle`: no border or fill until hovered (Fluent's subtle button). */
  appearance?: 'secondary' | 'subtle';
};

/**
 * A button of the pages without Fluent UI, looking like Fluent's medium button. A native `<button>`
 * (type "button" unless told), so its name, disabled state and keyboard use are the browser's own.
 */
export function PlainButton({ icon, appearance = 'secondary', className, children, type = 'button', ...rest }: PlainButtonProps) {
  const classes = [styles.button, appearance === 'subtle' && styles.subtle, icon && children === undefined && styles.iconOnly, className].filter(Boolean).join(' ');
  return (
    <button type={type} className={classes} {...rest}>
      {icon && <span className={styles.icon}>{icon}</span>}
      {children}
    </button>
  );
}

type PlainSwitchProps = { checked: boolean; onChange: (checked: boolean) => void; label: string };

/** An on/off switch (a checkbox with the `switch` role, named by its label), looking like Fluent's Switch. */
export function PlainSwitch({ checked, onChange, label }: PlainSwitchProps) {
  const id = useId();
  return (
    <div className={styles.switch}>
      <input id={id} type="checkbox" role="switch" className={styles.switchInput} checked={checked} onChange={(event) => onChange(event.currentTarget.checked)} />
      <div className={styles.switchTrack} aria-hidden="true">
        <svg className={styles.switchThumb} viewBox="0 0 18 18" focusable="false">
          <circle cx="9" cy="9" r="7.2" />
        </svg>
      </div>
      <label htmlFor={id} className={styles.switchLabel}>
        {label}
      </label>
    </div>
  );
}

/** Something is loading: a turning ring and what is loading, announced as a progress bar by its label. */
export function PlainSpinner({ label }: { label: string }) {
  const id = useId();
  return (
    <div className={styles.spinner} role="progressbar" aria-labelledby={id}>
      <span className={styles.spinnerRing} aria-hidden="true" />
      <span id={id}>{label}</span>
    </div>
  );
}
