import { readFileSync } from 'node:fs';
import { join } from 'node:path';

import { describe, expect, it } from 'vitest';

import { darkTheme, lightTheme } from './app/theme';

/*
 * locate.css gives the locate and sign-in pages (no Fluent UI, so no FluentProvider) the theme's token variables that
 * the shared components read; they must be the values FluentProvider sets in the app (app/theme.ts).
 */
/** A file of web/src (this file's folder; jsdom's import.meta.url is no file: URL). */
const source = (path: string) => readFileSync(join(import.meta.dirname, path), 'utf8');
const css = source('locate.css');

/** `--name: value;` declarations of one block of locate.css. */
function declarations(block: string): Map<string, string> {
  return new Map([...block.matchAll(/--([A-Za-z0-9]+):\s*([^;]+);/g)].map(([, name, value]) => [name!, value!.trim()]));
}

const normal = (value: string) => value.replace(/\s+/g, '').toLowerCase();
const darkStart = css.indexOf('@media (prefers-color-scheme: dark)');
const light = declarations(css.slice(0, darkStart));
const dark = declarations(css.slice(darkStart, css.indexOf('\n}\n', darkStart)));

describe('locate.css (the locate page’s theme without Fluent UI)', () => {
  it('should give every token the light theme’s value, and the dark theme’s under prefers-color-scheme: dark', () => {
    expect(darkStart).toBeGreaterThan(0);
    expect(light.size).toBeGreaterThan(20);
    for (const [name, value] of light) {
      const expected = (lightTheme as unknown as Record<string, string>)[name];
      expect(expected, `--${name} is not a theme token`).toBeDefined();
      expect(normal(value), `--${name}`).toBe(normal(expected!));
    }
    // Every colour defined for light is redefined for dark (the font is the same in both).
    expect([...dark.keys()].sort()).toEqual([...light.keys()].filter((name) => name !== 'fontFamilyBase').sort());
    for (const [name, value] of dark) expect(normal(value), `--${name} (dark)`).toBe(normal((darkTheme as unknown as Record<string, string>)[name]!));
  });

  it('should define every token variable the shared plain-CSS components read', () => {
    const used = new Set<string>();
    for (const file of ['./components/plain/controls.module.css', './components/plain/text.module.css', './components/installer-card.module.css', './components/marking-legend.module.css', './features/locate/components/locate-view.module.css', './features/locate/components/site-map-plan.module.css', './features/auth/components/sign-in-page.module.css']) {
      for (const [, name] of source(file).matchAll(/var\(--([A-Za-z0-9]+)\)/g)) used.add(name!);
    }
    expect([...used].filter((name) => !light.has(name))).toEqual([]);
  });
});
