/**
 * Hands `blob` to the browser as a download named `fileName`. The access token lives in memory, not a
 * cookie, so a file (a drawing, a packet, a mail attachment) is fetched and then saved rather than linked;
 * the address stays valid a moment so the browser can start the download.
 */
export function saveFile(blob: Blob, fileName: string): void {
  const href = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = href;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  window.setTimeout(() => URL.revokeObjectURL(href), 10_000);
}
