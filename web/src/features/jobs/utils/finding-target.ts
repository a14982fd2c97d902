import type { AsBuilt } from '@domain/as-built/as-built.schema';

/** The workspace's sections, in the order the crew works through them. */
export const SECTIONS = ['runs', 'equipment', 'walls', 'zones', 'amp', 'checks', 'photos', 'notes'] as const;
export type SectionId = (typeof SECTIONS)[number];

export const SECTION_LABELS: Record<SectionId, string> = {
  runs: 'Runs',
  equipment: 'Equipment',
  walls: 'Wall entries',
  zones: 'Zones',
  amp: 'Amplifier setup',
  checks: 'Checks',
  photos: 'Photos',
  notes: 'Notes',
};

/**
 * A place in the workspace a finding points at: the section, the record (run, item, check, zone) and
 * the field within it. `readingIndex` picks one depth reading of a run.
 */
export type FieldTarget = {
  section: SectionId;
  recordId?: string;
  field?: string;
  readingIndex?: number;
};

/**
 * Maps a finding's `path` into the as-built (e.g. `['runs', 3, 'depthReadings', 1]`) to the section,
 * record and field that show it. Unknown paths land on the section of their first segment.
 */
export function targetOfPath(path: readonly (string | number)[], asBuilt: AsBuilt): FieldTarget | undefined {
  const [collection, index, field, sub] = path;
  if (typeof index !== 'number') return undefined;
  if (collection === 'runs') {
    const run = asBuilt.runs[index];
    if (!run) return { section: 'runs' };
    if (field === 'depthReadings') {
      return { section: 'runs', recordId: run.id, field: 'depth', ...(typeof sub === 'number' ? { readingIndex: sub } : {}) };
    }
    return { section: 'runs', recordId: run.id, field: typeof field === 'string' ? field : 'label' };
  }
  if (collection === 'items') {
    const item = asBuilt.items[index];
    if (!item) return { section: 'equipment' };
    return {
      section: item.kind === 'wall_entry' ? 'walls' : 'equipment',
      recordId: item.id,
      field: typeof field === 'string' ? field : 'label',
    };
  }
  if (collection === 'checks') {
    const check = asBuilt.checks[index];
    return { section: 'checks', ...(check ? { recordId: check.id, field: typeof field === 'string' ? field : 'measuredOhm' } : {}) };
  }
  if (collection === 'zones') {
    const zone = asBuilt.zones[index];
    return { section: 'zones', ...(zone ? { recordId: zone.id, field: 'name' } : {}) };
  }
  return undefined;
}

/** The DOM id of the control that edits `field` of record `recordId`. */
export function fieldDomId(recordId: string, field: string, readingIndex?: number): string {
  return `field-${recordId}-${field}${readingIndex === undefined ? '' : `-${readingIndex}`}`;
}
