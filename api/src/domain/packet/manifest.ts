/** One line per file in `sha256sum` format (`<hex>  <path>`), sorted by path, ending in a newline. */
export function sha256Manifest(entries: readonly { path: string; sha256: string }[]): string {
  return (
    [...entries]
      .sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0))
      .map((e) => `${e.sha256}  ${e.path}`)
      .join('\n') + '\n'
  );
}

/** File name for an archive entry: lower-case letters, digits and dashes only, at most 60 characters. */
export function safeFileName(text: string, fallback: string): string {
  const slug = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return slug === '' ? fallback : slug;
}

/**
 * The packet's file name without extension, `<site>-<job>-rev-<n>` (e.g. `back-yard-garden-audio-rev-2`),
 * from the names frozen in the revision: safe characters only, the same for the download and the archive.
 */
export function packetFileBase(siteLabel: string, jobTitle: string, revision: number): string {
  return `${safeFileName(siteLabel, 'site')}-${safeFileName(jobTitle, 'job')}-rev-${revision}`;
}
