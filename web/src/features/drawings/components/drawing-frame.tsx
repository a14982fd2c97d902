import { makeStyles, mergeClasses, Spinner, Text, tokens } from '@fluentui/react-components';
import { useEffect, useState } from 'react';

const useStyles = makeStyles({
  // The drawing keeps a readable size on a phone: the frame scrolls sideways instead of shrinking it.
  frame: {
    overflowX: 'auto',
    overflowY: 'hidden',
    backgroundColor: tokens.colorNeutralBackground1,
    border: `${tokens.strokeWidthThin} solid ${tokens.colorNeutralStroke2}`,
    borderRadius: tokens.borderRadiusMedium,
    WebkitOverflowScrolling: 'touch',
  },
  drawing: {
    '& > svg': { display: 'block', width: '100%', height: 'auto' },
  },
  wide: { '& > svg': { minWidth: '640px' } },
  placeholder: { display: 'flex', alignItems: 'center', justifyContent: 'center', minHeight: '12rem', padding: tokens.spacingVerticalL },
});

type DrawingFrameProps = {
  /** Accessible name of the drawing, e.g. "Site plan". */
  label: string;
  /** Draws the SVG (the wiring schematic is laid out asynchronously). Re-run when it changes identity. */
  draw: () => string | Promise<string>;
  /** Keep at least 640 px wide (site plan, schematic); small drawings shrink to fit. */
  isWide?: boolean;
};

type DrawState = { status: 'drawing' } | { status: 'done'; svg: string } | { status: 'failed'; message: string };

/**
 * Shows one drawing made in the browser by the shared drawing code. The SVG is our own markup: svg.js
 * writes every label as a text node, so record text cannot become markup.
 */
export function DrawingFrame({ label, draw, isWide = false }: DrawingFrameProps) {
  const styles = useStyles();
  const [state, setState] = useState<DrawState>({ status: 'drawing' });

  useEffect(() => {
    let isCurrent = true;
    setState({ status: 'drawing' });
    Promise.resolve()
      .then(draw)
      .then(
        (svg) => isCurrent && setState({ status: 'done', svg }),
        (error: unknown) => isCurrent && setState({ status: 'failed', message: error instanceof Error ? error.message : String(error) }),
      );
    return () => {
      isCurrent = false;
    };
  }, [draw]);

  if (state.status === 'drawing') {
    return (
      <div className={mergeClasses(styles.frame, styles.placeholder)}>
        <Spinner size="small" label={`Drawing the ${label.toLowerCase()}…`} />
      </div>
    );
  }
  if (state.status === 'failed') {
    return (
      <div className={mergeClasses(styles.frame, styles.placeholder)} role="alert">
        <Text>
          The {label.toLowerCase()} could not be drawn: {state.message}
        </Text>
      </div>
    );
  }
  return (
    <div className={styles.frame} tabIndex={0} aria-label={`${label} (scroll sideways to see all of it)`} role="region">
      <div
        role="img"
        aria-label={label}
        data-drawing-ready="true"
        className={mergeClasses(styles.drawing, isWide && styles.wide)}
        // Our own SVG (see above); React cannot build SVG from a string any other way.
        dangerouslySetInnerHTML={{ __html: state.svg }}
      />
    </div>
  );
}
