import { makeStyles, tokens } from '@fluentui/react-components';

/** Shared look of the workspace's record forms: one column on a phone, big targets everywhere. */
export const useFormStyles = makeStyles({
  form: { display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalL },
  grid: {
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr)',
    gap: tokens.spacingVerticalL,
    '@media (min-width: 640px)': { gridTemplateColumns: 'repeat(2, minmax(0, 1fr))', columnGap: tokens.spacingHorizontalL },
  },
  wide: { gridColumn: '1 / -1' },
  control: {
    minHeight: '48px',
    fontSize: tokens.fontSizeBase400,
    minWidth: 0,
    // An example in an empty field must never read as a value: lighter and slanted, and its text starts "e.g.".
    '& input::placeholder, & textarea::placeholder, &::placeholder': { color: tokens.colorNeutralForeground4, fontStyle: 'italic', opacity: 1 },
    // A dropdown as tall as the fields beside it (Fluent draws its <select> 32 px tall).
    '& select': { height: '48px', minHeight: '48px', fontSize: tokens.fontSizeBase400 },
  },
  actions: { display: 'flex', flexWrap: 'wrap', gap: tokens.spacingHorizontalM },
  button: { minHeight: '48px', minWidth: '48px' },
  bigButton: { minHeight: '56px', paddingInline: tokens.spacingHorizontalXL, fontSize: tokens.fontSizeBase400 },
  groupTitle: { margin: 0 },
  unsaved: { color: tokens.colorPaletteDarkOrangeForeground1 },
});
