import type { BrandVariants } from '@fluentui/react-components';

/**
 * Loamline's brand ramp: a moss green, evenly spaced in lightness (OKLCH) from shade 10 to 160.
 * Fluent puts white text on shade 80 (light theme) and 70 (dark theme); both pass WCAG AA
 * (4.96:1 and 6.24:1). The logo mark uses shades 40, 60, 130 and 160.
 */
export const loamlineBrand: BrandVariants = {
  10: '#061005',
  20: '#0d1e09',
  30: '#102e05',
  40: '#1b3d0b',
  50: '#264c13',
  60: '#335c1c',
  70: '#426b28',
  80: '#517b35',
  90: '#628b45',
  100: '#749a57',
  110: '#87aa6b',
  120: '#9bba80',
  130: '#afc996',
  140: '#c0dba5',
  150: '#d6eac2',
  160: '#edf8e0',
};
