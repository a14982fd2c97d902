import { makeStyles, Toolbar, ToolbarRadioButton, tokens } from '@fluentui/react-components';
import {
  CompassNorthwest24Regular,
  CursorClick24Regular,
  Location24Regular,
  Ruler24Regular,
  Pen24Regular,
  Shapes24Regular,
  TargetArrow24Regular,
} from '@fluentui/react-icons';
import type { ReactElement } from 'react';

export type PlanTool = 'select' | 'reference' | 'feature' | 'route' | 'ties' | 'calibrate' | 'north';

export const TOOL_LABELS: Record<PlanTool, string> = {
  select: 'Select',
  reference: 'Ref. point',
  feature: 'Landmark',
  route: 'Route',
  ties: 'Ties',
  calibrate: 'Scale',
  north: 'North',
};

const TOOL_NAMES: Record<PlanTool, string> = {
  select: 'Select and move',
  reference: 'Add a reference point',
  feature: 'Draw landmarks (house, fences, patio …)',
  route: 'Draw a run route',
  ties: 'Place by ties',
  calibrate: 'Plan image and scale',
  north: 'Set north',
};

const TOOL_ICONS: Record<PlanTool, ReactElement> = {
  select: <CursorClick24Regular />,
  reference: <Location24Regular />,
  feature: <Shapes24Regular />,
  route: <Pen24Regular />,
  ties: <TargetArrow24Regular />,
  calibrate: <Ruler24Regular />,
  north: <CompassNorthwest24Regular />,
};

const useStyles = makeStyles({
  toolbar: {
    display: 'flex',
    flexWrap: 'nowrap',
    overflowX: 'auto',
    gap: tokens.spacingHorizontalXXS,
    padding: tokens.spacingHorizontalXXS,
    backgroundColor: tokens.colorNeutralBackground1,
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow2,
  },
  tool: {
    flexDirection: 'column',
    flexShrink: 0,
    minWidth: '56px',
    minHeight: '56px',
    paddingInline: tokens.spacingHorizontalXS,
    gap: '2px',
    fontSize: tokens.fontSizeBase200,
    lineHeight: tokens.lineHeightBase200,
  },
});

type PlanToolbarProps = {
  tools: readonly PlanTool[];
  tool: PlanTool;
  onToolChange: (tool: PlanTool) => void;
};

/** One tool at a time, as big buttons. */
export function PlanToolbar({ tools, tool, onToolChange }: PlanToolbarProps) {
  const styles = useStyles();
  return (
    <Toolbar
      aria-label="Plan tools"
      className={styles.toolbar}
      checkedValues={{ tool: [tool] }}
      onCheckedValueChange={(_event, data) => {
        if (data.name === 'tool' && data.checkedItems[0]) onToolChange(data.checkedItems[0] as PlanTool);
      }}
    >
      {tools.map((candidate) => (
        <ToolbarRadioButton
          key={candidate}
          name="tool"
          value={candidate}
          appearance="subtle"
          className={styles.tool}
          icon={TOOL_ICONS[candidate]}
          aria-label={TOOL_NAMES[candidate]}
          title={TOOL_NAMES[candidate]}
        >
          {TOOL_LABELS[candidate]}
        </ToolbarRadioButton>
      ))}
    </Toolbar>
  );
}
