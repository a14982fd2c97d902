/** A label to place beside a symbol, in screen pixels. */
export type LabelRequest = { id: string; x: number; y: number; text: string; fontSize: number };

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

/**
 * Places each label right, left, above or below its symbol: the first spot that stays inside the view
 * and clear of every symbol and of the labels placed before it (greedy, in the order given, so put
 * the most important first). A label with no clear spot goes to its first spot inside the view.
 */
export function layoutLabels(labels: readonly LabelRequest[], view: { width: number; height: number }): Map<string, PlacedLabel> {
  const symbols: Box[] = labels.map((l) => ({ left: l.x - SYMBOL_HALF, right: l.x + SYMBOL_HALF, top: l.y - SYMBOL_HALF, bottom: l.y + SYMBOL_HALF }));
  const taken: Box[] = [];
  const out = new Map<string, PlacedLabel>();
  for (const label of labels) {
    const candidates: PlacedLabel[] = [
      { x: label.x + GAP, y: label.y + label.fontSize / 3, textAnchor: 'start' },
      { x: label.x - GAP, y: label.y + label.fontSize / 3, textAnchor: 'end' },
      { x: label.x, y: label.y - GAP, textAnchor: 'middle' },
      { x: label.x, y: label.y + GAP + label.fontSize, textAnchor: 'middle' },
    ];
    const inView = candidates.filter((c) => {
      const b = boxOf(label, c);
      return b.left >= 0 && b.right <= view.width && b.top >= 0 && b.bottom <= view.height;
    });
    const clear = inView.find((c) => {
      const b = boxOf(label, c);
      return !taken.some((t) => overlaps(b, t)) && !symbols.some((s) => overlaps(b, s));
    });
    const chosen = clear ?? inView[0] ?? candidates[0]!;
    out.set(label.id, chosen);
    taken.push(boxOf(label, chosen));
  }
  return out;
}
