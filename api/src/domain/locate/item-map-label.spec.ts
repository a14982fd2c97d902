import { describe, expect, it } from 'vitest';

import { mapItemLabel } from './item-map-label.js';

// Our own wording rule for map labels (no published source): the kind is named once.
describe(mapItemLabel.name, () => {
  it.each([
    ['Garage', 'Wall entry: Garage'],
    ['Main wall entry', 'Main wall entry'],
    ['Wall entry to satellite 1', 'Wall entry to satellite 1'],
    ['WALL-ENTRY north', 'WALL-ENTRY north'],
    ['East wall entries', 'East wall entries'],
    ['  Cellar  ', 'Wall entry: Cellar'],
    ['', 'Wall entry'],
    // "Wallentry" or "entry by the wall" do not name the kind as a phrase: the kind is added.
    ['Entry by the wall', 'Wall entry: Entry by the wall'],
  ])('writes a wall entry labelled "%s" as "%s"', (label, expected) => {
    expect(mapItemLabel({ kind: 'wall_entry', label })).toBe(expected);
  });

  it('leaves other kinds as labelled, even when the label mentions a wall entry', () => {
    expect(mapItemLabel({ kind: 'junction', label: 'Splice by the wall entry' })).toBe('Splice by the wall entry');
    expect(mapItemLabel({ kind: 'speaker', label: 'Patio speaker' })).toBe('Patio speaker');
  });
});
