import { describe, expect, it } from 'vitest';

import { formatDepthLength, formatQuantity, formatRuleDepth } from './length.js';

// 1 in = 0.0254 m exactly (NIST SP 811, appendix B.8); expected texts worked by hand:
// 0.15 m = 5.906 in → 5 7/8 in to the eighth; 0.11 m = 4.331 in → 4 3/8 in. NEC (NFPA 70) Table 300.5
// gives its own metric values, 150 mm for 6 in and 450 mm for 18 in: a rule stored as those reads back
// as the inches it was written in; a measured depth never does.
describe(formatRuleDepth.name, () => {
  it.each([
    [0.15, 'imperial', '6 in', '5 7/8 in'],
    [0.45, 'imperial', '18 in', '17 3/4 in'],
    [0.11, 'imperial', '4 3/8 in', '4 3/8 in'],
    [0.1524, 'imperial', '6 in', '6 in'],
    [0.0127, 'imperial', '1/2 in', '1/2 in'],
    [0, 'imperial', '0 in', '0 in'],
    [0.15, 'metric', '15 cm', '15 cm'],
    [0.455, 'metric', '45.5 cm', '45.5 cm'],
  ] as const)('should print a rule of %f m (%s) as %j (a measured depth: %j)', (m, system, rule, measured) => {
    expect(formatRuleDepth(m, system)).toBe(rule);
    expect(formatDepthLength(m, system)).toBe(measured);
  });
});

describe(formatQuantity.name, () => {
  // 3 m = 118.11 in = 9 ft 10 in (nearest inch), hand-worked from NIST SP 811 B.8.
  it.each([
    [{ kind: 'length', m: 3 }, 'imperial', '9 ft 10 in'],
    [{ kind: 'length', m: 3 }, 'metric', '3 m'],
    [{ kind: 'depth', m: 0.127 }, 'imperial', '5 in'],
    [{ kind: 'depth', m: 0.127 }, 'metric', '12.7 cm'],
    [{ kind: 'rule_depth', m: 0.15 }, 'imperial', '6 in'],
    [{ kind: 'depth', m: 0.023 }, 'imperial', '7/8 in'],
  ] as const)('should write %j in %s as %j', (q, system, text) => {
    expect(formatQuantity(q, system)).toBe(text);
  });
});
