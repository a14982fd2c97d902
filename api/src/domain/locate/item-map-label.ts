/*
 * The text a map writes beside an item (the locate view, the locate sheet in the packet). A wall entry
 * says what it is, since its symbol alone is easy to take for a junction — but only once: a crew that
 * named it "Main wall entry" gets "Main wall entry", not "Wall entry: Main wall entry".
 */

/** "wall entry" (also "wall-entry", "wall entries"), as a phrase inside a label, in any case. */
const NAMES_WALL_ENTRY = /\bwall[\s-]*entr(?:y|ies)\b/i;

/** The map label of an item: its label, with "Wall entry: " before a wall entry's unless it already says so. */
export function mapItemLabel(item: { kind: string; label: string }): string {
  const label = item.label.trim();
  if (item.kind !== 'wall_entry' || NAMES_WALL_ENTRY.test(label)) return label;
  return label === '' ? 'Wall entry' : `Wall entry: ${label}`;
}
