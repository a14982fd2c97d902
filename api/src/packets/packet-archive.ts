import { createHash } from 'node:crypto';
import { createReadStream, createWriteStream, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pipeline } from 'node:stream/promises';

import { ZipArchive } from 'archiver';

import { featureCollectionToKml } from '../domain/geometry/kml.js';
import { archiveReadme } from '../domain/packet/archive-readme.js';
import { CSV_BOM, cableScheduleCsv } from '../domain/packet/cable-schedule-csv.js';
import { packetFileBase, safeFileName, sha256Manifest } from '../domain/packet/manifest.js';
import type { PacketPhoto, PacketSnapshot } from '../domain/packet/packet-snapshot.js';

export interface ArchiveInput {
  snapshot: PacketSnapshot;
  pdf: Buffer;
  sitePlanSvg: string;
  schematicSvg: string;
  photos: readonly PacketPhoto[];
}

export interface BuiltArchive {
  /** Path of the zip in a private temporary folder; call `dispose()` when done with it. */
  path: string;
  bytes: number;
  sha256: string;
  /** The manifest lines, as written into the archive. */
  manifest: string;
  dispose: () => void;
}

const sha256 = (data: Buffer | string) => createHash('sha256').update(data).digest('hex');

const PHOTO_EXTENSIONS: Record<string, string> = { jpeg: 'jpg', png: 'png', webp: 'webp' };

/**
 * The revision's archive: `README.txt`, the PDF (`<site>-<job>-rev-<n>.pdf`), both drawings, the cable
 * schedule CSV (UTF-8 with a byte-order mark; SI and, for an imperial company, feet and inches), the
 * as-built JSON, GeoJSON and KML of runs and items (when the site has a WGS 84 origin), the print photos
 * in `photos/` and `MANIFEST.sha256` (verify with `sha256sum -c MANIFEST.sha256`). Archives already
 * stored are never rebuilt, so earlier revisions keep their bytes. The zip is streamed to a temporary file while its SHA-256 is
 * computed, never assembled in memory.
 */
export async function buildPacketArchive(input: ArchiveInput): Promise<BuiltArchive> {
  const { snapshot } = input;
  const pdfName = `${packetFileBase(snapshot.site.label, snapshot.job.title, snapshot.revision)}.pdf`;
  const files: { path: string; data: Buffer }[] = [
    { path: pdfName, data: input.pdf },
    { path: 'site-plan.svg', data: Buffer.from(input.sitePlanSvg, 'utf8') },
    { path: 'wiring-schematic.svg', data: Buffer.from(input.schematicSvg, 'utf8') },
    { path: 'cable-schedule.csv', data: Buffer.from(CSV_BOM + cableScheduleCsv(snapshot), 'utf8') },
    {
      path: 'as-built.json',
      data: Buffer.from(
        `${JSON.stringify({ revision: snapshot.revision, issuedAt: snapshot.issuedAt, job: snapshot.job, site: snapshot.site, asBuilt: snapshot.asBuilt, channelSetups: snapshot.channelSetups }, null, 2)}\n`,
        'utf8',
      ),
    },
  ];
  if (snapshot.analysis.geojson) {
    files.push({ path: 'runs-and-items.geojson', data: Buffer.from(`${JSON.stringify(snapshot.analysis.geojson, null, 2)}\n`, 'utf8') });
    const kmlName = `${snapshot.site.label}: ${snapshot.job.title}, revision ${snapshot.revision}`;
    files.push({ path: 'runs-and-items.kml', data: Buffer.from(featureCollectionToKml(snapshot.analysis.geojson, kmlName), 'utf8') });
  }
  let photoCount = 0;
  input.photos.forEach((photo, i) => {
    const match = /^data:image\/(jpeg|png|webp);base64,(.*)$/s.exec(photo.dataUri);
    if (!match) return;
    const name = `${String(i + 1).padStart(2, '0')}-${safeFileName(photo.caption, 'photo')}.${PHOTO_EXTENSIONS[match[1]!]}`;
    files.push({ path: `photos/${name}`, data: Buffer.from(match[2]!, 'base64') });
    photoCount += 1;
  });
  const readme = archiveReadme({ snapshot, pdfName, hasGeoJson: snapshot.analysis.geojson !== null, photoCount });
  files.unshift({ path: 'README.txt', data: Buffer.from(readme, 'utf8') });
  const manifest = sha256Manifest(files.map((f) => ({ path: f.path, sha256: sha256(f.data) })));

  const dir = mkdtempSync(join(tmpdir(), 'loamline-archive-'));
  const dispose = () => rmSync(dir, { recursive: true, force: true });
  try {
    const path = join(dir, 'archive.zip');
    const zip = new ZipArchive({ zlib: { level: 6 } });
    const written = pipeline(zip, createWriteStream(path));
    const date = new Date(snapshot.issuedAt);
    for (const file of files) {
      // PDFs and photos are already compressed; storing them saves time and changes nothing in size.
      const isCompressed = file.path.endsWith('.pdf') || file.path.startsWith('photos/');
      zip.append(file.data, { name: file.path, date, store: isCompressed });
    }
    zip.append(manifest, { name: 'MANIFEST.sha256', date });
    await zip.finalize();
    await written;
    const hash = createHash('sha256');
    let bytes = 0;
    for await (const chunk of createReadStream(path)) {
      hash.update(chunk as Buffer);
      bytes += (chunk as Buffer).length;
    }
    return { path, bytes, sha256: hash.digest('hex'), manifest, dispose };
  } catch (error) {
    dispose();
    throw error;
  }
}
