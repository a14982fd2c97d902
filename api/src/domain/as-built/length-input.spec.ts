import { describe, expect, it } from 'vitest';

import { parseLengthInput } from './length-input.js';

// Expected metres use the exact definitions 1 ft = 0.3048 m and 1 in = 0.0254 m (international yard and
// pound agreement, 1959; NIST Special Publication 811, 2008 edition, appendix B.8), worked by hand:
// e.g. 18 ft 6 in = 222 in × 0.0254 = 5.6388 m.
describe(parseLengthInput.name, () => {
  it.each([
    // feet and inches, the ways a tape reading is typed on a phone
    [`18' 6"`, 'imperial', 'long', 5.6388],
    [`18'6"`, 'imperial', 'long', 5.6388],
    [`18' 6`, 'imperial', 'long', 5.6388],
    ['18 6', 'imperial', 'long', 5.6388],
    ['18ft 6in', 'imperial', 'long', 5.6388],
    ['18 ft 6 in', 'imperial', 'long', 5.6388],
    ['18 feet 6 inches', 'imperial', 'long', 5.6388],
    ['18’ 6”', 'imperial', 'long', 5.6388], // a phone's smart punctuation
    ['18′ 6″', 'imperial', 'long', 5.6388],
    ['18 ft 6 in', 'metric', 'long', 5.6388], // explicit units win over the field's system
    ['18.5', 'imperial', 'long', 5.6388],
    ['18.5 ft', 'metric', 'long', 5.6388],
    ['40', 'imperial', 'long', 12.192],
    // inches and fractions of an inch: 4 1/4 in = 4.25 × 0.0254 = 0.10795 m
    ['6"', 'imperial', 'short', 0.1524],
    ['6 in', 'imperial', 'short', 0.1524],
    ['6', 'imperial', 'short', 0.1524],
    ['6"', 'imperial', 'long', 0.1524],
    ['4 1/4 in', 'imperial', 'short', 0.10795],
    ['4 1/4', 'imperial', 'short', 0.10795],
    ['4¼', 'imperial', 'short', 0.10795],
    ['4¼"', 'imperial', 'short', 0.10795],
    ['3/4"', 'imperial', 'short', 0.01905],
    ['½', 'imperial', 'short', 0.0127],
    ['18 in', 'imperial', 'short', 0.4572],
    [`2' 4 1/2"`, 'imperial', 'long', 0.7239], // 28.5 in
    // metric
    ['2.5 m', 'imperial', 'long', 2.5],
    ['12.5', 'metric', 'long', 12.5],
    ['1,5 m', 'metric', 'long', 1.5],
    ['.5', 'metric', 'long', 0.5],
    ['15 cm', 'imperial', 'short', 0.15],
    ['15', 'metric', 'short', 0.15],
    ['150mm', 'metric', 'short', 0.15],
    ['1 m 20 cm', 'metric', 'long', 1.2],
    ['0', 'metric', 'short', 0],
  ] as const)('should read %j (%s, %s) as %f m', (input, system, scale, metres) => {
    const result = parseLengthInput(input, { system, scale, field: 'Station' });
    expect(result).toEqual({ ok: true, metres: expect.closeTo(metres, 9) });
  });

  it.each([
    ['', 'imperial', 'long', 'Depth: enter a length'],
    ['   ', 'imperial', 'short', 'Depth: enter a length'],
    ['abc', 'imperial', 'long', 'Depth: cannot read "abc" as a length'],
    [`18' 13"`, 'imperial', 'long', `Depth: 13 in is a foot or more; write 19' 1" instead.`],
    ['18 13', 'imperial', 'long', `Depth: 13 in is a foot or more; write 19' 1" instead.`],
    ['18ft 12in', 'imperial', 'long', 'Depth: 12 in is a foot or more'],
    ['-3', 'imperial', 'long', 'Depth cannot be negative.'],
    [`-18' 6"`, 'imperial', 'long', 'Depth cannot be negative.'],
    ['−2 m', 'metric', 'long', 'Depth cannot be negative.'],
    ['4 5/4', 'imperial', 'short', 'Depth: write 5/4 as a whole number'],
    ['1/0', 'imperial', 'short', 'Depth: a fraction cannot have 0 below the line.'],
    ['4.5 1/2', 'imperial', 'short', 'Depth: use either a decimal or a fraction'],
    ['3 4', 'imperial', 'short', 'Depth: cannot read "3 4"'], // two bare numbers in a depth field
    ['18 6', 'metric', 'long', 'Depth: cannot read "18 6"'],
    ['6 in 4 furlongs', 'imperial', 'short', 'Depth: cannot read'],
    ['2 m 3 m', 'metric', 'long', 'Depth: cannot read'],
    ['6 in 2 ft', 'imperial', 'long', 'Depth: cannot read'],
    ['12 ft 6 in 3', 'imperial', 'long', 'Depth: cannot read'],
    ['5 yd', 'imperial', 'long', 'Depth: cannot read'],
  ] as const)('should refuse %j (%s, %s) saying %j', (input, system, scale, message) => {
    const result = parseLengthInput(input, { system, scale, field: 'Depth' });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.message.startsWith(message)).toBe(true);
  });

  it('should name the field as "Length" when none is given', () => {
    expect(parseLengthInput('abc', { system: 'metric', scale: 'long' })).toEqual({
      ok: false,
      message: 'Length: cannot read "abc" as a length; type e.g. 12.5 m.',
    });
  });
});
