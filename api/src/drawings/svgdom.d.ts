// svgdom 0.1.25 ships no type declarations (see shared VERSIONS.md); only what node-svg-window.ts uses.
declare module 'svgdom' {
  export function createSVGWindow(): Window & typeof globalThis;
}
