/** A label to place beside a symbol, in screen pixels. `isPinned`: shown even where it overlaps (the selected item). */
export type LabelRequest = { id: string; x: number; y: number; text: string; fontSize: number; isPinned?: boolean };

export type PlacedLabel = { x: number; y: number; textAnchor: 'start' | 'middle' | 'end' };

type Box = { left: number; top: number; right: number; bottom: number };

/** Roughly how wide a line of the UI font is: 0.58 em per character (a guess on the safe side, not a measurement). */
const EM_PER_CHAR = 0.58;
/** Half the size of a symbol, pixels: labels keep clear of every symbol. */
const SYMBOL_HALF = 11;
const GAP = 15;

function boxOf(label: LabelRequest, placed: PlacedLabel): Box {
  const width = label.text.length * label.fontSize * EM_PER_CHAR;
  const left = placed.textAnchor === 'start' ? placed.x : placed.textAnchor === 'end' ? placed.x - width : placed.x - width / 2;
  return { left, right: left + width, top: placed.y - label.fontSize, bottom: placed.y + 3 };
}

function overlaps(a: Box, b: Box): boolean {
  return a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom;
}

/** Where a label may go around its symbol: beside, above, below, then the corners, then the same farther out. */
function candidatesFor(label: LabelRequest): PlacedLabel[] {
  const spots: PlacedLabel[] = [];
  const middle = label.fontSize / 3;
  for (const gap of [GAP, GAP * 2]) {
    spots.push(
      { x: label.x + gap, y: label.y + middle, textAnchor: 'start' },
      { x: label.x - gap, y: label.y + middle, textAnchor: 'end' },
      { x: label.x, y: label.y - gap, textAnchor: 'middle' },
      { x: label.x, y: label.y + gap + label.fontSize, textAnchor: 'middle' },
      { x: label.x + gap * 0.7, y: label.y - gap * 0.7, textAnchor: 'start' },
      { x: label.x + gap * 0.7, y: label.y + gap * 0.7 + label.fontSize, textAnchor: 'start' },
      { x: label.x - gap * 0.7, y: label.y - gap * 0.7, textAnchor: 'end' },
      { x: label.x - gap * 0.7, y: label.y + gap * 0.7 + label.fontSize, textAnchor: 'end' },
    );
  }
  return spots;
}

/**
 * Places each label around its symbol: the first spot (see candidatesFor) that stays inside the view
 * and clear of every symbol and of the labels placed before it (greedy, in the order given, so put
 * the most important first). A label with no clear spot is left out of the map: names written over
 * each other can be read by nobody, and zooming in (labels are laid out again in screen pixels) or
 * tapping the symbol shows it. A pinned label (the selected item) is placed all the same, first.
 */
export function layoutLabels(labels: readonly LabelRequest[], view: { width: number; height: number }): Map<string, PlacedLabel> {
  const symbols: Box[] = labels.map((l) => ({ left: l.x - SYMBOL_HALF, right: l.x + SYMBOL_HALF, top: l.y - SYMBOL_HALF, bottom: l.y + SYMBOL_HALF }));
  const taken: Box[] = [];
  const out = new Map<string, PlacedLabel>();
  const ordered = [...labels.filter((l) => l.isPinned), ...labels.filter((l) => !l.isPinned)];
  for (const label of ordered) {
    const candidates = candidatesFor(label);
    const inView = candidates.filter((c) => {
      const b = boxOf(label, c);
      return b.left >= 0 && b.right <= view.width && b.top >= 0 && b.bottom <= view.height;
    });
    const clear = inView.find((c) => {
      const b = boxOf(label, c);
      return !taken.some((t) => overlaps(b, t)) && !symbols.some((s) => overlaps(b, s));
    });
    const chosen = clear ?? (label.isPinned ? (inView[0] ?? candidates[0]!) : undefined);
    if (!chosen) continue;
    out.set(label.id, chosen);
    taken.push(boxOf(label, chosen));
  }
  return out;
}
