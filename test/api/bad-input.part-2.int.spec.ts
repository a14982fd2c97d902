// Part 2 of the bad-input suite: its route cases are dealt out over bad-input.int.spec.ts and its part
// files so that they run in parallel (test/support/file-parts.ts). Nothing to edit here: add cases to
// bad-input.int.spec.ts. All parts: `npx vitest run --project integration bad-input`.
// The query makes it a module of its own: files of a worker share one module cache (isolate: false).
await import('./bad-input.int.spec.js?part=2');
