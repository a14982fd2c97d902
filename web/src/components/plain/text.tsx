import type { HTMLAttributes } from 'react';

import styles from './text.module.css';

type TextProps = HTMLAttributes<HTMLElement> & {
  as?: 'span' | 'p' | 'h1' | 'h2' | 'h3';
  /** Fluent's type ramp: 200 (12 px), 300 (14 px, the default), 400, 500, 600, 700 (28 px). */
  size?: 200 | 300 | 400 | 500 | 600 | 700;
  weight?: 'regular' | 'semibold' | 'bold';
  /** On a line of its own. */
  block?: boolean;
  'data-testid'?: string;
};

const SIZES = { 200: styles.size200, 300: undefined, 400: styles.size400, 500: styles.size500, 600: styles.size600, 700: styles.size700 };

/**
 * Text of the pages without Fluent UI (the public locate view), with the same sizes and weights as
 * Fluent's Text, so a page keeps its look without Fluent's runtime.
 */
export function Text({ as: Tag = 'span', size = 300, weight = 'regular', block = false, className, ...rest }: TextProps) {
  const classes = [styles.text, SIZES[size], weight === 'semibold' && styles.semibold, weight === 'bold' && styles.bold, block && styles.block, className].filter(Boolean).join(' ');
  return <Tag className={classes} {...rest} />;
}
