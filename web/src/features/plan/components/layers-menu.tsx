import { Button, makeStyles, Menu, MenuItemCheckbox, MenuList, MenuPopover, MenuTrigger, tokens, Tooltip } from '@fluentui/react-components';
import { Layer24Regular } from '@fluentui/react-icons';

import type { PlanLayers } from '../utils/plan-records';

const LAYER_LABELS: Record<keyof PlanLayers, string> = {
  image: 'Plan image',
  references: 'Reference points and ties',
  labels: 'Labels',
  runs: 'Runs',
  spareAndAbandoned: 'Spare and abandoned runs',
};

const useStyles = makeStyles({
  button: { minWidth: '48px', minHeight: '48px', boxShadow: tokens.shadow4 },
  item: { minHeight: '44px' },
});

/** Which layers the plan shows, as a menu of check marks. */
export function LayersMenu({ layers, onChange }: { layers: PlanLayers; onChange: (layers: PlanLayers) => void }) {
  const styles = useStyles();
  const keys = Object.keys(LAYER_LABELS) as (keyof PlanLayers)[];
  return (
    <Menu
      checkedValues={{ layers: keys.filter((key) => layers[key]) }}
      onCheckedValueChange={(_event, data) => onChange(Object.fromEntries(keys.map((key) => [key, data.checkedItems.includes(key)])) as PlanLayers)}
    >
      <MenuTrigger disableButtonEnhancement>
        <Tooltip content="Layers" relationship="label">
          <Button className={styles.button} icon={<Layer24Regular />} />
        </Tooltip>
      </MenuTrigger>
      <MenuPopover>
        <MenuList>
          {keys.map((key) => (
            <MenuItemCheckbox key={key} name="layers" value={key} className={styles.item}>
              {LAYER_LABELS[key]}
            </MenuItemCheckbox>
          ))}
        </MenuList>
      </MenuPopover>
    </Menu>
  );
}
