import { formatDateTime } from '../format/date-time.js';
import type { PacketSnapshot } from './packet-snapshot.js';

export interface ArchiveReadmeInput {
  snapshot: PacketSnapshot;
  pdfName: string;
  hasGeoJson: boolean;
  photoCount: number;
}

/**
 * `README.txt` of a packet archive: what each file is, which units the files use and which coordinate
 * system the drawings and map files are in. Plain text with CRLF line ends, so it opens the same in every
 * editor.
 */
export function archiveReadme({ snapshot, pdfName, hasGeoJson, photoCount }: ArchiveReadmeInput): string {
  const imperial = snapshot.settings.units === 'imperial';
  const origin = snapshot.asBuilt.site?.origin;
  const lines = [
    `${snapshot.company.name}: as-built handover packet`,
    `Site: ${snapshot.site.label}`,
    `Job: ${snapshot.job.title}`,
    `Revision ${snapshot.revision}, issued ${formatDateTime(snapshot.issuedAt, { timeZone: snapshot.settings.timeZone ?? null, locale: snapshot.settings.locale ?? null })}`,
    '',
    'FILES',
    `  ${pdfName}`,
    '      The handover packet as printed: the document to keep and to show anyone digging near the cables.',
    '  site-plan.svg, wiring-schematic.svg',
    '      The site plan and the wiring schematic as drawings that scale without losing detail.',
    '  cable-schedule.csv',
    '      One row per cable run: ends, cable, length, burial method and depths. UTF-8 with a byte-order mark;',
    imperial
      ? '      lengths and depths in metres (columns ending _m) and in feet and inches (columns ending _ft and _in),'
      : '      lengths and depths in metres (columns ending _m),',
    imperial
      ? '      and written as the packet writes them (columns ending _text, such as 26 ft 3 in and 4 3/8 in).'
      : '      and written as the packet writes them (columns ending _text, such as 8.01 m and 11.5 cm).',
    '  as-built.json',
    '      Everything recorded on site for this revision, in machine-readable form (lengths and depths in metres).',
    ...(hasGeoJson
      ? [
          '  runs-and-items.geojson, runs-and-items.kml',
          '      Cable runs and equipment positions on the map, for mapping programs (GeoJSON, RFC 7946, and KML 2.2).',
        ]
      : []),
    ...(photoCount > 0 ? ['  photos/', `      ${photoCount} photo(s) from the installation, numbered as in the packet.`] : []),
    '  MANIFEST.sha256',
    '      The SHA-256 sum of every other file. To check nothing changed: sha256sum -c MANIFEST.sha256',
    '',
    'UNITS',
    imperial
      ? '  The packet prints feet and inches. The CSV has both; as-built.json and the map files use metres.'
      : '  Everything is in metric units (metres, centimetres, square millimetres).',
    '  Conductor sizes are AWG or mm² as written on the cable; resistances in ohms.',
    '',
    'COORDINATES',
    '  Positions in as-built.json and on the drawings are plan metres: x to the plan\'s right and y to its',
    '  top, from the plan\'s point (0, 0).',
    ...(hasGeoJson && origin
      ? ['  The GeoJSON and KML files are longitude and latitude in WGS 84 (decimal degrees), placed from the', '  site\'s origin: the WGS 84 position of plan point (0, 0) and the bearing of the plan\'s top.']
      : ['  This site has no WGS 84 origin, so there are no map files; positions are plan metres only.']),
    '',
    'SAFETY',
    '  Depths are as recorded at installation. Before digging, call the one-call (811) service to have',
    '  buried utilities marked, and follow local codes and the authority having jurisdiction.',
    '',
  ];
  return lines.join('\r\n');
}
