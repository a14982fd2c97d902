// Part 3 of the authorization matrix: its routes are dealt out over authorization-matrix.int.spec.ts and
// its part files so that they run in parallel (test/support/file-parts.ts). Nothing to edit here: add
// routes to authorization-matrix.int.spec.ts. All parts: `npx vitest run --project integration authorization-matrix`.
// The query makes it a module of its own: files of a worker share one module cache (isolate: false).
await import('./authorization-matrix.int.spec.js?part=3');
