// fontkit 2 ships no type declarations; only what the font-metrics test (text-box.spec.ts) uses.
declare module 'fontkit' {
  export interface Glyph {
    advanceWidth: number;
  }
  export interface Font {
    unitsPerEm: number;
    hasGlyphForCodePoint(codePoint: number): boolean;
    glyphForCodePoint(codePoint: number): Glyph;
    layout(text: string, features?: string[]): { advanceWidth: number };
  }
  export function openSync(path: string): Font;
}
