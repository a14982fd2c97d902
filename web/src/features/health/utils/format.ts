/** "1.2 ms" below 10 ms, whole milliseconds above. */
export function formatLatency(ms: number): string {
  const digits = ms < 10 ? 1 : 0;
  return `${ms.toLocaleString(undefined, { minimumFractionDigits: digits, maximumFractionDigits: digits })} ms`;
}

/** The two largest units only: "45 s", "12 min 5 s", "3 h 20 min", "4 d 6 h". */
export function formatUptime(totalSeconds: number): string {
  const seconds = Math.max(0, Math.floor(totalSeconds));
  const days = Math.floor(seconds / 86_400);
  const hours = Math.floor((seconds % 86_400) / 3_600);
  const minutes = Math.floor((seconds % 3_600) / 60);
  const secs = seconds % 60;
  if (days > 0) return `${days} d ${hours} h`;
  if (hours > 0) return `${hours} h ${minutes} min`;
  if (minutes > 0) return `${minutes} min ${secs} s`;
  return `${secs} s`;
}
