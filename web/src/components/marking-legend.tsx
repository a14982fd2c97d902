import type { ItemKind } from '@domain/as-built/item.schema';
import { colourKeyNote, FEATURE_FILL, FEATURE_STROKE, legendText, REFERENCE_INK, WARNING_INK, type LegendKey } from '@drawings/marking-palette';

import { ItemSymbol, ReferenceSymbol, RunLine } from '../features/plan/components/plan-symbols';
import { HALO } from '../config/canvas-theme';

import styles from './marking-legend.module.css';

const ITEM_KINDS: readonly string[] = ['amplifier', 'speaker', 'subwoofer', 'junction', 'spare_end', 'wall_entry'];

function Swatch({ entry }: { entry: LegendKey }) {
  const y = 10;
  if (entry.startsWith('run:')) return <RunLine style={entry.slice(4) as never} points={[{ x: 2, y }, { x: 42, y }]} isRouteRecorded />;
  switch (entry) {
    case 'route_not_recorded':
      return <RunLine style="direct_burial" points={[{ x: 2, y }, { x: 42, y }]} isRouteRecorded={false} />;
    case 'reference_point':
      return <ReferenceSymbol x={22} y={y} />;
    case 'tie':
      return <line x1={2} y1={y} x2={42} y2={y} stroke={REFERENCE_INK} strokeWidth={1.2} strokeDasharray="8 3 2 3" />;
    case 'accuracy':
      return <circle cx={22} cy={y} r={8} fill="none" stroke={REFERENCE_INK} strokeWidth={1.2} strokeDasharray="4 3" />;
    case 'shallow':
      return (
        <g>
          <polygon points="14,3 30,3 22,17" fill={WARNING_INK} />
          <rect x={21.2} y={5} width={1.6} height={6} fill={HALO} />
        </g>
      );
    case 'feature':
      return <rect x={4} y={3} width={36} height={14} fill={FEATURE_FILL} stroke={FEATURE_STROKE} strokeWidth={1.2} />;
    default:
      return ITEM_KINDS.includes(entry) ? <ItemSymbol kind={entry as ItemKind} x={22} y={y} /> : null;
  }
}

/**
 * The map legend: the same words as the printed drawings and the packet (marking-palette.ts,
 * MARKING_LEGEND), with the same line styles, for the entries the map shows. Its words are spelled for
 * `locale`: the installer's on a public page, the signed-in person's company locale in the app (none: en-US). No
 * Fluent UI (the public locate view has none): plain CSS on Fluent's token variables.
 */
export function MarkingLegend({ keys, label = 'Legend', locale }: { keys: readonly LegendKey[]; label?: string; locale: string | null | undefined }) {
  const spelling = locale;
  return (
    <div className={styles.root} role="group" aria-label={label} data-testid="marking-legend">
      <ul className={styles.list}>
        {keys.map((key) => (
          <li key={key} className={styles.entry} data-legend={key}>
            <svg className={styles.swatch} width={44} height={20} viewBox="0 0 44 20" aria-hidden="true">
              <Swatch entry={key} />
            </svg>
            <span>{legendText(key, spelling)}</span>
          </li>
        ))}
      </ul>
      <p className={styles.note}>{colourKeyNote(spelling)}</p>
    </div>
  );
}
