import { describe, expect, it } from 'vitest';

import { formatCoverDepth, formatDepthLength } from './length.js';

// 1 in = 0.0254 m exactly (NIST SP 811, appendix B.8); expected texts worked by hand:
// 0.15 m = 5.906 in → 6 in to the quarter, 5 7/8 in to the eighth; 0.11 m = 4.331 in → 4 1/4, 4 3/8.
describe(formatCoverDepth.name, () => {
  it.each([
    [0.15, 'imperial', '6 in', '5 7/8 in'],
    [0.11, 'imperial', '4 1/4 in', '4 3/8 in'],
    [0.0127, 'imperial', '1/2 in', '1/2 in'],
    [0.4572, 'imperial', '18 in', '18 in'],
    [0, 'imperial', '0 in', '0 in'],
    [0.11, 'metric', '11 cm', '11 cm'],
    [0.455, 'metric', '46 cm', '45.5 cm'],
  ] as const)('should print %f m (%s) as %j (screens: %j)', (m, system, print, screen) => {
    expect(formatCoverDepth(m, system)).toBe(print);
    expect(formatDepthLength(m, system)).toBe(screen);
  });
});
