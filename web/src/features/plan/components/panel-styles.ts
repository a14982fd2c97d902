import { makeStyles, tokens } from '@fluentui/react-components';

/** The look of the tool panels under (or beside) the plan: big targets for gloved, dirty hands. */
export const usePanelStyles = makeStyles({
  panel: {
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalM,
    padding: tokens.spacingHorizontalL,
    backgroundColor: tokens.colorNeutralBackground1,
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow2,
  },
  title: { margin: 0 },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalS },
  button: { minHeight: '48px', minWidth: '48px' },
  linkButton: {
    display: 'inline-flex',
    alignItems: 'center',
    gap: tokens.spacingHorizontalXS,
    minHeight: '48px',
    paddingInline: tokens.spacingHorizontalM,
    borderRadius: tokens.borderRadiusMedium,
    color: tokens.colorBrandForegroundLink,
    fontWeight: tokens.fontWeightSemibold,
    textDecorationLine: 'none',
    ':hover': { backgroundColor: tokens.colorNeutralBackground1Hover },
  },
  control: {
    minHeight: '48px',
    fontSize: tokens.fontSizeBase400,
    minWidth: 0,
    '& select': { height: '48px', minHeight: '48px', fontSize: tokens.fontSizeBase400 },
    '& input::placeholder': { color: tokens.colorNeutralForeground4, fontStyle: 'italic', opacity: 1 },
  },
  muted: { color: tokens.colorNeutralForeground2 },
  warning: { color: tokens.colorPaletteDarkOrangeForeground1 },
  facts: { display: 'grid', gridTemplateColumns: 'auto minmax(0, 1fr)', columnGap: tokens.spacingHorizontalM, rowGap: tokens.spacingVerticalXS, margin: 0 },
  factName: { color: tokens.colorNeutralForeground2 },
  factValue: { margin: 0 },
});
