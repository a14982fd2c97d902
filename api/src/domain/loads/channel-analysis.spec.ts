import { describe, expect, it } from 'vitest';

import type { AmplifierItem } from '../as-built/item.schema.js';
import { cableLossDb, ratedOutputVoltage } from './channel-analysis.js';

const amp: AmplifierItem = {
  id: 'amp',
  kind: 'amplifier',
  label: 'Amp',
  channels: [{ id: 'a', name: 'A' }],
  ratedWatts8Ohm: 400,
  ratedWatts4Ohm: 600,
  minimumImpedanceOhm: 4,
};

describe(ratedOutputVoltage.name, () => {
  // [CVN]: the maximum output voltage of a 400 W @ 8 Ω amplifier is √(400·8) = 56.6 V.
  it.each([
    [8, 56.5685, 'rated_8_ohm'],
    [16, 56.5685, 'rated_8_ohm'],
    [5.33, Math.sqrt(2400), 'rated_4_ohm'],
    [4, Math.sqrt(2400), 'rated_4_ohm'],
  ] as const)('should drive a %f Ω load at %f V (%s)', (z, v, basis) => {
    const sut = ratedOutputVoltage(amp, amp.channels[0]!, z);
    expect(sut.voltageV).toBeCloseTo(v, 3);
    expect(sut.basis).toBe(basis);
  });

  it('should fall back to the 8 Ω rating when no 4 Ω rating is given', () => {
    const { ratedWatts4Ohm: _ignored, ...noFour } = amp;
    expect(ratedOutputVoltage(noFour, amp.channels[0]!, 4).basis).toBe('rated_8_ohm');
  });

  it('should use the line voltage on a constant-voltage channel', () => {
    const sut = ratedOutputVoltage(amp, { id: 'cv', name: 'CV', constantVoltage: { lineVoltage: '100V', ratedWatts: 120 } }, 50);
    expect(sut).toEqual({ voltageV: 100, basis: 'cv_line' });
  });
});

describe(cableLossDb.name, () => {
  it.each([
    [10, 10, 0],
    [5, 10, 6.0206],
    [0, 0, 0],
  ])('should give %f V against %f V ideal a loss of %f dB', (v, ideal, db) => {
    expect(cableLossDb(v, ideal)).toBeCloseTo(db, 4);
  });
});
