/** The Node module that reads files, typed by hand: the web's tsconfig has no Node types. */
type NodeFs = { readFile(path: string): Promise<Uint8Array> };

/**
 * The bytes of a file under the repository's `test/fixtures/` (e.g. `photos/field-photo.heic`). Web
 * tests run in Node (jsdom is only the page), so they can read the same binary fixtures as the
 * integration and browser tests.
 */
export async function readFixture(path: string): Promise<Uint8Array<ArrayBuffer>> {
  const specifier = 'node:fs/promises';
  const fs = (await import(/* @vite-ignore */ specifier)) as NodeFs;
  // `here` in a variable: Vite rewrites `new URL(`…${x}`, import.meta.url)` into a lookup of built assets.
  // A path, not the URL: under jsdom `URL` is jsdom's, which Node's fs does not take.
  const here = import.meta.url;
  const file = decodeURIComponent(new URL(`../../../test/fixtures/${path}`, here).pathname);
  return new Uint8Array(await fs.readFile(file));
}
