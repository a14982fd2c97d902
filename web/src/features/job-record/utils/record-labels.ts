import type { ItemKind } from '@domain/as-built/item.schema';
import type { BurialLocation, InstallMethod } from '@domain/as-built/run.schema';

export const ITEM_KIND_LABELS: Record<ItemKind, string> = {
  amplifier: 'Amplifier',
  speaker: 'Speaker',
  subwoofer: 'Subwoofer',
  junction: 'Splice / junction',
  spare_end: 'Spare end',
  wall_entry: 'Wall entry',
};

export const METHOD_LABELS: Record<InstallMethod, string> = {
  direct_burial: 'Direct burial',
  conduit: 'In conduit',
  under_hardscape_sleeve: 'Sleeve under hardscape',
  indoor: 'Indoor (not buried)',
};

export const LOCATION_LABELS: Record<BurialLocation, string> = {
  general: 'Lawn, beds, anywhere else',
  under_hardscape: 'Under a patio or walk',
  under_driveway: 'Under a driveway',
  under_street: 'Under a street or parking',
  trench_below_concrete: 'Trench below concrete',
  under_building: 'Under a building',
};
