import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import pixelmatch from 'pixelmatch';
import { PNG } from 'pngjs';
import { expect } from 'vitest';

/**
 * Screenshot comparison against committed references in test/e2e/__screenshots__ (the pattern of
 * drawings-visual.e2e.spec.ts): `UPDATE_VISUAL=1` (re)writes the reference; on a difference above the
 * tolerance the diff and the actual image go to .data/visual-diffs/.
 */
const SCREENSHOTS = fileURLToPath(new URL('../e2e/__screenshots__/', import.meta.url));
const DIFFS = fileURLToPath(new URL('../../.data/visual-diffs/', import.meta.url));

export function compareWithReference(name: string, actual: Buffer, tolerance = { pixelThreshold: 0.1, maxDiffRatio: 0.005 }): void {
  const referencePath = join(SCREENSHOTS, `${name}.png`);
  if (process.env.UPDATE_VISUAL === '1') {
    mkdirSync(SCREENSHOTS, { recursive: true });
    writeFileSync(referencePath, actual);
    return;
  }
  expect(existsSync(referencePath), `no reference image test/e2e/__screenshots__/${name}.png: run once with UPDATE_VISUAL=1, look at it, commit it`).toBe(true);
  const expected = PNG.sync.read(readFileSync(referencePath));
  const got = PNG.sync.read(actual);
  mkdirSync(DIFFS, { recursive: true });
  const actualPath = join(DIFFS, `${name}-actual.png`);
  if (expected.width !== got.width || expected.height !== got.height) {
    writeFileSync(actualPath, actual);
    expect.fail(`${name}: the screenshot is ${got.width}×${got.height} px, the reference ${expected.width}×${expected.height} px (actual in .data/visual-diffs/)`);
  }
  const diff = new PNG({ width: got.width, height: got.height });
  const differing = pixelmatch(expected.data, got.data, diff.data, got.width, got.height, { threshold: tolerance.pixelThreshold });
  const ratio = differing / (got.width * got.height);
  if (ratio > tolerance.maxDiffRatio) {
    writeFileSync(join(DIFFS, `${name}-diff.png`), PNG.sync.write(diff));
    writeFileSync(actualPath, actual);
  }
  expect(ratio, `${name}: ${(ratio * 100).toFixed(2)} % of pixels differ (see .data/visual-diffs/${name}-diff.png; UPDATE_VISUAL=1 rewrites the reference)`).toBeLessThanOrEqual(
    tolerance.maxDiffRatio,
  );
}
