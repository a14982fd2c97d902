import { makeStyles, Text, tokens } from '@fluentui/react-components';
import type { AsBuiltAnalysis } from '@domain/analysis/analyze';
import type { AsBuilt } from '@domain/as-built/as-built.schema';

const useStyles = makeStyles({
  list: { listStyle: 'none', margin: 0, padding: 0, display: 'flex', flexDirection: 'column', gap: tokens.spacingVerticalXS },
  item: { display: 'flex', flexWrap: 'wrap', columnGap: tokens.spacingHorizontalS },
  muted: { color: tokens.colorNeutralForeground2 },
});

function ohms(value: number | null): string {
  if (value === null) return 'open';
  return `${Number(value.toFixed(value < 10 ? 1 : 0))} Ω`;
}

/**
 * One line per amplifier channel: the load it sees, the worst level drop at a speaker on it (against ideal
 * cable) and the share of the amplifier's output dissipated in its cable.
 */
export function ChannelSummaries({ analysis, asBuilt }: { analysis: AsBuiltAnalysis; asBuilt: AsBuilt }) {
  const styles = useStyles();
  if (analysis.channels.length === 0) return null;
  const ampLabel = (id: string) => asBuilt.items.find((item) => item.id === id)?.label ?? 'Amplifier';
  return (
    <ul className={styles.list} aria-label="Amplifier channels">
      {analysis.channels.map((channel) => {
        const worst = channel.loads.reduce<number | null>((max, load) => (max === null || load.cableLossDb > max ? load.cableLossDb : max), null);
        const load =
          channel.mode === 'constant_voltage' && channel.cv
            ? `${channel.cv.totalTapWatts.toFixed(0)} W of taps on a ${channel.cv.ratedWatts} W channel`
            : `load ${ohms(channel.loadOhmWithCable)} (amp needs ≥ ${ohms(channel.minimumImpedanceOhm)})`;
        return (
          <li key={`${channel.channel.amplifierItemId}-${channel.channel.channelId}`} className={styles.item}>
            <Text weight="semibold">
              {channel.channelName.includes(ampLabel(channel.channel.amplifierItemId))
                ? channel.channelName
                : `${ampLabel(channel.channel.amplifierItemId)} · ${channel.channelName}`}
              :
            </Text>
            <Text>{load}</Text>
            <Text className={styles.muted}>
              {worst === null
                ? 'no speakers'
                : `worst level drop at a speaker ${worst.toFixed(2)} dB · cable dissipates ${channel.cableDissipationPct.toFixed(1)} % of the output`}
            </Text>
          </li>
        );
      })}
    </ul>
  );
}
