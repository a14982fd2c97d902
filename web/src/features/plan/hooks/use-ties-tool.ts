import { useState } from 'react';
import type { AsBuilt } from '@domain/as-built/as-built.schema';
import type { PlanPoint } from '@domain/as-built/common.schema';

import { usePersistedDraft } from '../../../lib/drafts';
import { lengthInputValue, parseLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import type { useJobWriter } from '../../jobs';
import type { PlanHit } from '../components/plan-canvas';
import { roundPlanPoint } from '../utils/plan-geometry';
import { itemBodyWith, solveTies, tieDraftsOf, type TieDraft } from '../utils/plan-records';

type JobWrite = Parameters<ReturnType<typeof useJobWriter>['save']>[0];

type TiesToolOptions = {
  jobId: string;
  asBuilt: AsBuilt;
  /** The editor's one way to save a job write (says saved / kept on the device / failed). */
  saveJobWrite: (write: JobWrite, done: string) => Promise<unknown>;
};

/**
 * The plan editor's ties tool: choose an item (or tap it), tap reference points to tie from, type the
 * taped distances; the item's position is solved from them as you type and saved with its ties. The
 * ties are kept on the device until saved.
 */
export function useTiesTool({ jobId, asBuilt, saveJobWrite }: TiesToolOptions) {
  const [units] = useUnitPreferences();
  const [itemId, setItemId] = useState('');
  const [error, setError] = useState<string | undefined>();
  const item = asBuilt.items.find((candidate) => candidate.id === itemId);
  const draftKey = `job:${jobId}:plan-ties:${itemId || 'none'}`;
  const draft = usePersistedDraft<{ ties: TieDraft[]; sideHint: '' | 'left' | 'right' }>(draftKey, {
    ties: tieDraftsOf(item, (m) => lengthInputValue(m, units.length, 'long')),
    sideHint: item?.sideHint ?? '',
  });
  const solution = itemId ? solveTies(draft.value.ties, draft.value.sideHint, asBuilt.referencePoints, units.length) : undefined;

  const start = (next: string) => {
    setItemId(next);
    setError(undefined);
  };

  const save = async () => {
    if (!item || !solution?.ok) return;
    const ties = draft.value.ties
      .filter((tie) => tie.referencePointId !== '' && tie.distance.trim() !== '')
      .map((tie) => {
        const distance = parseLength(tie.distance, units.length, 'long');
        return { referencePointId: tie.referencePointId, distanceM: distance.ok ? distance.metres : Number.NaN };
      });
    if (ties.some((tie) => !Number.isFinite(tie.distanceM))) {
      setError('A distance cannot be read: fix it or remove that tie.');
      return;
    }
    setError(undefined);
    const p = roundPlanPoint(solution);
    await saveJobWrite(
      {
        endpoint: 'replaceItem',
        params: { itemId: item.id },
        body: itemBodyWith(item, {
          ties,
          sideHint: draft.value.sideHint || undefined,
          position: { ...p, source: 'ties', ...(Number.isFinite(solution.accuracyM) ? { accuracyM: Math.min(solution.accuracyM, 10_000) } : {}) },
        }),
        draftKey,
        label: `Position of "${item.label}"`,
      },
      'Position saved',
    );
  };

  /** Whether a tap on this item chooses it (amplifiers are placed by hand, not tied). */
  const isTieable = (id: string) => asBuilt.items.some((candidate) => candidate.id === id && candidate.kind !== 'amplifier');

  return {
    itemId,
    ties: draft.value.ties,
    solution,
    start,
    /** The lines from each tied reference point to the solved position, for the canvas. */
    tieLines: (): { from: PlanPoint; to: PlanPoint }[] =>
      solution?.ok
        ? draft.value.ties.flatMap((tie) => {
            const rp = asBuilt.referencePoints.find((candidate) => candidate.id === tie.referencePointId);
            return rp ? [{ from: rp, to: { x: solution.x, y: solution.y } }] : [];
          })
        : [],
    /** A tap while the tool is open: choose an item, or tie from a reference point. */
    tap: (hit: PlanHit | undefined) => {
      if (hit?.type === 'item' && isTieable(hit.id)) {
        start(hit.id);
        return 'started' as const;
      }
      if (hit?.type === 'reference' && itemId) {
        const { ties, sideHint } = draft.value;
        if (ties.some((tie) => tie.referencePointId === hit.id)) return undefined;
        const empty = ties.findIndex((tie) => tie.referencePointId === '');
        const next = empty >= 0 ? ties.map((tie, i) => (i === empty ? { ...tie, referencePointId: hit.id } : tie)) : [...ties, { referencePointId: hit.id, distance: '' }];
        draft.setValue({ ties: next, sideHint });
      }
      return undefined;
    },
    hint: itemId ? 'Tap a reference point to tie from it, then type the taped distance.' : 'Choose the item to place, or tap it on the plan.',
    panel: {
      asBuilt,
      itemId,
      ties: draft.value.ties,
      sideHint: draft.value.sideHint,
      onChange: (ties: TieDraft[], sideHint: '' | 'left' | 'right') => draft.setValue({ ties, sideHint }),
      solution,
      hasDraft: draft.hasDraft,
      error,
      onSave: () => void save(),
      onDiscard: () => draft.clear(),
    },
  };
}
