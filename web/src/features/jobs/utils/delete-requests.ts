import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { Item } from '@domain/as-built/item.schema';
import type { Run } from '@domain/as-built/run.schema';
import type { CommissioningCheck } from '@domain/checks/commissioning-check.schema';

import type { JobWrite } from '../api/send-job-write';

import { ITEM_KIND_LABELS } from '../../job-record';

/** One record to delete: what the dialog says, the DELETE itself and, where cheap, how to take it back. */
export type DeleteRequest = {
  /** "Delete the run “Patio trunk”?" */
  title: string;
  /** What goes with it and what stays, in plain words. */
  consequences: string;
  /** The DELETE write (versioned like every job write). */
  write: JobWrite;
  /** "Run deleted" */
  doneTitle: string;
  /** Re-creates the record (with a new id) when the toast's Undo is chosen; left out where that is not cheap. */
  undo?: JobWrite;
};

function quoted(labels: string[]): string {
  return labels.map((label) => `“${label}”`).join(', ');
}

/** Leaves out the id: the server gives a re-created record a new one. */
function withoutId<T extends { id: string }>(record: T): Omit<T, 'id'> {
  const { id: _id, ...rest } = record;
  return rest;
}

/** What still points at an item: runs ending at it or carrying its channels, checks of its channels. */
export function usesOfItem(asBuilt: AsBuilt, itemId: string): { runs: string[]; checks: number } {
  const runs = asBuilt.runs
    .filter(
      (run) =>
        run.fromItemId === itemId ||
        run.toItemId === itemId ||
        run.pairs.some((pair) => pair.channel?.amplifierItemId === itemId),
    )
    .map((run) => run.label);
  const checks = asBuilt.checks.filter((check) => check.channel.amplifierItemId === itemId).length;
  return { runs, checks };
}

/**
 * Deleting an item takes its ties and position (and an amplifier's channels with their setup); photos
 * of it stay with the job. The API refuses while a run or check uses it, so the dialog says so up front.
 * Undo re-creates it, except an amplifier, whose channel setups a re-created item would not have.
 */
export function itemDeleteRequest(asBuilt: AsBuilt, item: Item): DeleteRequest {
  const kind = ITEM_KIND_LABELS[item.kind].toLowerCase();
  const uses = usesOfItem(asBuilt, item.id);
  const parts = [
    item.kind === 'amplifier'
      ? 'Its channels, their setup, its ties and position are deleted with it.'
      : 'Its ties and position are deleted with it.',
    'Photos of it stay with the job.',
  ];
  if (uses.runs.length > 0 || uses.checks > 0) {
    const what = [
      ...(uses.runs.length > 0 ? [`${uses.runs.length === 1 ? 'the run' : 'the runs'} ${quoted(uses.runs)}`] : []),
      ...(uses.checks > 0 ? [`${uses.checks === 1 ? 'one check' : `${uses.checks} checks`} of its channels`] : []),
    ].join(' and ');
    parts.push(`It is still used by ${what}: change or delete ${uses.runs.length + uses.checks === 1 ? 'that' : 'those'} first.`);
  }
  return {
    title: `Delete the ${kind} “${item.label}”?`,
    consequences: parts.join(' '),
    write: { endpoint: 'deleteItem', params: { itemId: item.id }, label: `Deleting the ${kind} “${item.label}”` },
    doneTitle: `${ITEM_KIND_LABELS[item.kind]} “${item.label}” deleted`,
    undo:
      item.kind === 'amplifier'
        ? undefined
        : { endpoint: 'createItem', params: {}, body: withoutId(item), label: `Putting back the ${kind} “${item.label}”` },
  };
}

/** Deleting a run takes its depth readings and route; its photos stay with the job. Undo re-creates all of it. */
export function runDeleteRequest(run: Run): DeleteRequest {
  const readings = run.depthReadings?.length ?? 0;
  return {
    title: `Delete the run “${run.label}”?`,
    consequences: [
      readings === 0
        ? 'Its route and pairs are deleted with it.'
        : `Its ${readings === 1 ? 'depth reading' : `${readings} depth readings`}, route and pairs are deleted with it.`,
      'Photos of it stay with the job.',
    ].join(' '),
    write: { endpoint: 'deleteRun', params: { runId: run.id }, label: `Deleting the run “${run.label}”` },
    doneTitle: `Run “${run.label}” deleted`,
    undo: { endpoint: 'createRun', params: {}, body: withoutId(run), label: `Putting back the run “${run.label}”` },
  };
}

/** Deleting a zone leaves its equipment without a zone; Undo is offered only when nothing was in it. */
export function zoneDeleteRequest(asBuilt: AsBuilt, zone: { id: string; name: string }): DeleteRequest {
  const count = asBuilt.items.filter((item) => item.zoneId === zone.id).length;
  return {
    title: `Delete the zone “${zone.name}”?`,
    consequences:
      count === 0
        ? 'No equipment is in it.'
        : `Its ${count === 1 ? 'piece of equipment stays' : `${count} pieces of equipment stay`}, without a zone.`,
    write: { endpoint: 'deleteZone', params: { zoneId: zone.id }, label: `Deleting the zone “${zone.name}”` },
    doneTitle: `Zone “${zone.name}” deleted`,
    undo:
      count === 0
        ? { endpoint: 'createZone', params: {}, body: { name: zone.name }, label: `Putting back the zone “${zone.name}”` }
        : undefined,
  };
}

/** One depth reading; photos of it stay with the job. */
export function depthReadingDeleteRequest(
  run: Run,
  readingId: string,
  reading: { stationM: number; depthM: number },
  description: string,
): DeleteRequest {
  return {
    title: 'Delete this depth reading?',
    consequences: `The reading of ${description} on “${run.label}” is deleted. Photos of it stay with the job.`,
    write: { endpoint: 'deleteDepthReading', params: { runId: run.id, readingId }, label: `Deleting a depth reading on “${run.label}”` },
    doneTitle: 'Depth reading deleted',
    undo: {
      endpoint: 'addDepthReading',
      params: { runId: run.id },
      body: { stationM: reading.stationM, depthM: reading.depthM },
      label: `Putting back a depth reading on “${run.label}”`,
    },
  };
}

/** One commissioning check. */
export function checkDeleteRequest(check: CommissioningCheck, description: string): DeleteRequest {
  return {
    title: 'Delete this check?',
    consequences: `The check ${description} is deleted; the comparison with the computed value goes with it.`,
    write: { endpoint: 'deleteCheck', params: { checkId: check.id }, label: `Deleting the check ${description}` },
    doneTitle: 'Check deleted',
    undo: { endpoint: 'createCheck', params: {}, body: withoutId(check), label: `Putting back the check ${description}` },
  };
}
