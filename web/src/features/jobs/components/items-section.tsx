import { Button, Text } from '@fluentui/react-components';
import { Add24Regular, Camera20Regular, Delete20Regular, Edit20Regular } from '@fluentui/react-icons';
import { useEffect, useState } from 'react';
import type { Item, ItemKind } from '@domain/as-built/item.schema';

import { formatLength } from '../../../lib/units';
import { useUnitPreferences } from '../../../lib/use-unit-preferences';
import { PhotoStrip } from '../../photos';
import { usePhotoActions } from '../../photos';
import type { JobAsBuiltResponse } from '../../job-record';
import { useWorkspaceFocus } from '../hooks/workspace-focus';
import { itemDeleteRequest } from '../utils/delete-requests';
import { existingRemoveRequest, isInSiteRecord, RemovedRecords, SiteRecordNote } from './site-record-note';
import { ITEM_KIND_LABELS } from '../../job-record';

import { useCardStyles } from '../../../components/card-styles';
import { useDeleteRecord } from './delete-record';
import { useFormStyles } from '../../../components/form-styles';
import { ItemForm } from './item-form';

const EQUIPMENT_KINDS: readonly ItemKind[] = ['speaker', 'subwoofer', 'amplifier', 'junction', 'spare_end'];
const WALL_KINDS: readonly ItemKind[] = ['wall_entry'];

type ItemsSectionProps = { data: JobAsBuiltResponse; canRecord: boolean; kinds: 'equipment' | 'walls' };

function facts(item: Item): string[] {
  switch (item.kind) {
    case 'amplifier':
      return [`${item.channels.length} channels`, `${item.ratedWatts8Ohm} W at 8 Ω`, `stable to ${item.minimumImpedanceOhm} Ω`];
    case 'speaker':
      return [item.constantVoltage ? `${item.constantVoltage.tapWatts} W tap on ${item.constantVoltage.lineVoltage}` : `${item.nominalImpedanceOhm} Ω`];
    case 'subwoofer':
      return [`${item.voiceCoils === 'dual' ? 'Dual' : 'Single'} ${item.coilImpedanceOhm} Ω coil${item.voiceCoils === 'dual' ? 's' : ''}`];
    case 'junction':
      return [item.spliceType ?? 'Splice', item.isAccessible ? 'reachable' : 'buried'];
    case 'spare_end':
      return [item.isCapped ? 'Capped' : 'Not capped', ...(item.marker ? [item.marker] : [])];
    case 'wall_entry':
      return [item.wallMaterial ?? 'Wall', ...(item.sleeve ? [item.sleeve] : []), ...(item.sealant ? [`sealed: ${item.sealant}`] : [])];
  }
}

/** Equipment by kind (or the wall entries), each with its kind's fields, ties and solved position. */
export function ItemsSection({ data, canRecord, kinds }: ItemsSectionProps) {
  const styles = useCardStyles();
  const formStyles = useFormStyles();
  const [units] = useUnitPreferences();
  const { target } = useWorkspaceFocus();
  const photos = usePhotoActions();
  const deletion = useDeleteRecord();
  const [editing, setEditing] = useState<{ id: string; field?: string } | undefined>();
  const { asBuilt, analysis, job } = data;
  const allowed = kinds === 'walls' ? WALL_KINDS : EQUIPMENT_KINDS;
  const items = asBuilt.items.filter((item) => allowed.includes(item.kind));
  const section = kinds === 'walls' ? 'walls' : 'equipment';
  const title = kinds === 'walls' ? 'Wall entries' : 'Equipment';

  useEffect(() => {
    if (target?.section === section && target.recordId) setEditing({ id: target.recordId, field: target.field });
  }, [section, target]);

  return (
    <section aria-labelledby={`section-${section}`} className={formStyles.form}>
      <div className={styles.sectionHead}>
        <Text as="h3" id={`section-${section}`} size={500} weight="semibold" className={styles.title}>
          {title} ({items.length})
        </Text>
        {canRecord && editing?.id !== 'new' && (
          <Button appearance="primary" className={formStyles.bigButton} icon={<Add24Regular />} onClick={() => setEditing({ id: 'new' })}>
            {kinds === 'walls' ? 'Add wall entry' : 'Add equipment'}
          </Button>
        )}
      </div>
      {editing?.id === 'new' && (
        <div className={styles.card}>
          <ItemForm jobId={job.id} asBuilt={asBuilt} kind={allowed[0]!} kinds={allowed} onDone={() => setEditing(undefined)} />
        </div>
      )}
      {items.length === 0 ? (
        <Text as="p" className={styles.empty}>
          {kinds === 'walls' ? 'No wall entries recorded yet.' : 'No equipment recorded yet.'}
        </Text>
      ) : (
        <ul className={styles.list} aria-label={title}>
          {items.map((item) => {
            const position = analysis.positions.find((p) => p.itemId === item.id);
            const zone = asBuilt.zones.find((z) => z.id === item.zoneId);
            return (
              <li key={item.id} className={styles.card} aria-label={item.label}>
                <div className={styles.header}>
                  <div>
                    <Text as="h4" size={400} weight="semibold" className={styles.title}>
                      {item.label}
                    </Text>
                    <Text block>
                      {ITEM_KIND_LABELS[item.kind]}
                      {item.model ? ` · ${item.model}` : ''}
                      {zone ? ` · ${zone.name}` : ''}
                    </Text>
                  </div>
                </div>
                <div className={styles.facts}>
                  {facts(item).map((fact) => (
                    <span key={fact}>{fact}</span>
                  ))}
                  {position ? (
                    <span>
                      Placed {position.source === 'ties' ? 'from ties' : position.source === 'gps' ? 'by GPS' : 'by hand'}
                      {position.accuracyM !== null ? `, ±${formatLength(position.accuracyM, units.length, 'short')}` : ''}
                    </span>
                  ) : (
                    item.kind !== 'amplifier' && <span>No position yet</span>
                  )}
                </div>
                <SiteRecordNote data={data} recordId={item.id} label={item.label} canRecord={canRecord} />
                <PhotoStrip target={{ type: 'item', id: item.id }} label={item.label} />
                {editing?.id !== item.id && (canRecord || photos.canChange) && (
                  <div className={styles.actions}>
                    {canRecord && (
                      <Button className={formStyles.bigButton} icon={<Edit20Regular />} onClick={() => setEditing({ id: item.id })}>
                        Change
                      </Button>
                    )}
                    {canRecord && (
                      <Button
                        className={formStyles.bigButton}
                        icon={<Delete20Regular />}
                        aria-label={`Delete ${item.label}`}
                        onClick={() => {
                          const info = data.records.siteRecords?.[item.id];
                          deletion.ask(isInSiteRecord(info) ? existingRemoveRequest('item', item, info!.isThisJob) : itemDeleteRequest(asBuilt, item));
                        }}
                      >
                        Delete
                      </Button>
                    )}
                    {photos.canChange && (
                      <Button className={formStyles.bigButton} icon={<Camera20Regular />} onClick={() => photos.addPhotos({ type: 'item', id: item.id })}>
                        Add photos
                      </Button>
                    )}
                  </div>
                )}
                {editing?.id === item.id && (
                  <ItemForm
                    jobId={job.id}
                    asBuilt={asBuilt}
                    item={item}
                    kind={item.kind}
                    kinds={allowed}
                    focusField={editing.field}
                    onDone={() => setEditing(undefined)}
                  />
                )}
              </li>
            );
          })}
        </ul>
      )}
      {kinds === 'equipment' && <RemovedRecords data={data} kind="item" canRecord={canRecord} />}
      {deletion.dialog}
    </section>
  );
}
