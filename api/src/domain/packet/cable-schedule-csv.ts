import { metresToFeet, metresToInches } from '../as-built/units.js';
import { formatGauge } from '../cable/wire.js';
import { formatDepthLength, formatGroundLength } from '../format/length.js';
import type { PacketSnapshot } from './packet-snapshot.js';

/**
 * A CSV cell: quoted when it holds a separator, quote or line break; a leading `=`, `+`, `-`, `@`, tab
 * or carriage return is prefixed with `'` so a spreadsheet never runs text typed on site as a formula.
 */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  let text = String(value);
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

const round = (value: number | null | undefined, digits: number): number | null =>
  value === null || value === undefined ? null : Number(value.toFixed(digits));

/**
 * UTF-8 byte-order mark for the archive's CSV: without it some spreadsheet programs read the file in a
 * legacy code page and print "mm²" or a site name with accents as mojibake.
 */
export const CSV_BOM = '\uFEFF';

/**
 * The cable schedule as CSV (RFC 4180, CRLF line ends), in SI units with fixed columns so it can be
 * re-imported; one row per run in record order. An imperial company also gets its own units as numbers
 * in extra columns (`length_ft`, `min_depth_in`, `max_depth_in`), and every company gets the length and
 * depths written as the packet writes them, in its own units (`length_text` `26 ft 3 in` / `8.01 m`,
 * `min_depth_text` and `max_depth_text` `4 3/8 in` / `11.1 cm`, through domain/format), at the end, so
 * the SI columns keep their places.
 */
export function cableScheduleCsv(snapshot: PacketSnapshot): string {
  const { asBuilt, analysis } = snapshot;
  const items = new Map(asBuilt.items.map((i) => [i.id, i.label]));
  const depth = new Map(analysis.depth.map((d) => [d.runId, d]));
  const imperial = snapshot.settings.units === 'imperial';
  const inches = (m: number | null | undefined) => (m === null || m === undefined ? null : round(metresToInches(m), 2));
  const header = [
    'run',
    'from',
    'to',
    'cable_type',
    'gauge',
    'conductors',
    'length_m',
    'method',
    'min_depth_m',
    'max_depth_m',
    'depth_readings',
    'depth_check',
    'is_spare',
    'is_abandoned',
    ...(imperial ? ['length_ft', 'min_depth_in', 'max_depth_in'] : []),
    'length_text',
    'min_depth_text',
    'max_depth_text',
  ];
  const system = snapshot.settings.units;
  const depthText = (m: number | null | undefined) => (m === null || m === undefined ? '' : formatDepthLength(m, system));
  const rows = asBuilt.runs.map((run) => {
    const d = depth.get(run.id);
    return [
      run.label,
      items.get(run.fromItemId) ?? '',
      items.get(run.toItemId) ?? '',
      run.cableType,
      formatGauge(run.gauge),
      run.conductors,
      round(run.measuredLengthM, 3),
      run.method,
      round(d?.minDepthM, 3),
      round(d?.maxDepthM, 3),
      run.depthReadings?.length ?? 0,
      d?.status ?? '',
      run.isSpare ?? false,
      run.isAbandoned ?? false,
      ...(imperial ? [round(metresToFeet(run.measuredLengthM), 2), inches(d?.minDepthM), inches(d?.maxDepthM)] : []),
      formatGroundLength(run.measuredLengthM, system),
      depthText(d?.minDepthM),
      depthText(d?.maxDepthM),
    ];
  });
  return [header, ...rows].map((row) => row.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
