import { createDarkTheme, createLightTheme, type Theme } from '@fluentui/react-components';

import { loamlineBrand } from '../config/brand';

// Our shipped faces first (fonts.css), then the platform's own UI font so text stays readable if a
// font file fails to load.
const fontFamilyBase = "'Inter', system-ui, sans-serif";
// Figures use Inter with tabular numerals (see the components) rather than a second typeface.
const fontFamilyMonospace = fontFamilyBase;

const fonts = { fontFamilyBase, fontFamilyMonospace, fontFamilyNumeric: fontFamilyBase };

export const lightTheme: Theme = {
  ...createLightTheme(loamlineBrand),
  ...fonts,
};

const darkBase = createDarkTheme(loamlineBrand);

export const darkTheme: Theme = {
  ...darkBase,
  ...fonts,
  // On dark surfaces shade 100 only just reaches 4.5:1; lighter shades keep brand text and links easy
  // to read outdoors.
  colorBrandForeground1: loamlineBrand[110],
  colorBrandForeground2: loamlineBrand[120],
  colorBrandForegroundLink: loamlineBrand[110],
  colorBrandForegroundLinkHover: loamlineBrand[120],
  colorBrandForegroundLinkPressed: loamlineBrand[130],
  colorCompoundBrandForeground1: loamlineBrand[110],
  colorCompoundBrandStroke: loamlineBrand[110],
};
