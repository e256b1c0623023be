/** The top of the results: what is wrong and on which lines, each finding once (the marker shape beside photo findings). */
import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import type { ResultOverview } from '../../contracts/result-parts';
import { MarkerGlyph } from '../map/marker-glyph';
import { space } from '../theme';
import { Card, Heading, Text } from '../ui';
import { attentionItems, lineList } from './attention';
import { statusLooks } from './station-status';

export function AttentionCard({ result }: { result: Pick<ResultOverview, 'lines' | 'warnings'> }) {
  const items = useMemo(() => attentionItems(result), [result]);
  return (
    <Card testID="results-wrong">
      <Heading level={2}>{items.length ? 'What needs attention' : 'Nothing needs attention'}</Heading>
      {items.length === 0 ? (
        <Text>Every photo meets the targets, and the engine raised no warning beyond the standing cautions.</Text>
      ) : (
        <View role="list" aria-label="What needs attention, and where" style={styles.list}>
          {items.map((i) => (
            <View key={i.key} role="listitem" style={styles.item} testID={`results-wrong-${i.key}`}>
              {i.status ? <MarkerGlyph shape={statusLooks[i.status].shape} color={statusLooks[i.status].color} sizePx={13} /> : <Text variant="label" aria-hidden>⚠</Text>}
              <Text style={styles.words}>
                {i.title}
                {i.lines.length ? <Text variant="bodyStrong">{` On ${lineList(i.lines)}.`}</Text> : null}
              </Text>
            </View>
          ))}
        </View>
      )}
      {items.length ? (
        <Text variant="caption" tone="muted">
          Each line's own notes are listed with its profile: choose the line below.
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  item: { flexDirection: 'row', alignItems: 'flex-start', gap: space.sm },
  words: { flex: 1 },
});
