/** The report's ground proof: the spec in every ground cell, the share of area per item and the largest shortfalls (the map is on the version screen and in the PDF). */
import { StyleSheet, View } from 'react-native';
import type { ReportCoverage } from '../../contracts/reports';
import { areaWords, shareWords } from '../../contracts/coverage-words';
import { space } from '../theme';
import { Card, Heading, List, Text } from '../ui';

export function ReportCoverageCard({ coverage: c }: { coverage: ReportCoverage }) {
  return (
    <Card testID="report-coverage">
      <Heading level={2}>Ground proof</Heading>
      {c.state !== 'ready' ? (
        <Text tone="caution" testID="report-coverage-note">{c.note}</Text>
      ) : (
        <>
          <Text testID="report-coverage-spec">Spec: {c.spec} ({c.cellM} m cells over {areaWords(c.areaM2 ?? 0)}).</Text>
          <Text variant="caption" tone="muted">{c.note}</Text>
          <List label="Share of the area meeting each item" style={styles.list} testID="report-coverage-items">
            {c.items.map((it) => (
              <View key={it.item} testID={`report-coverage-item-${it.item}`}>
                <Text variant="bodyStrong">{it.title}</Text>
                <Text tone={it.share < 1 ? 'caution' : 'success'}>
                  {shareWords(it.share)} of the area{it.failingAreaM2 > 0 ? ` · ${areaWords(it.failingAreaM2)} short` : ' · met everywhere'}
                </Text>
              </View>
            ))}
          </List>
          <Text variant="bodyStrong">Every item met on {shareWords(c.shareAll ?? 0)} of the area.</Text>
          {c.patches.length ? (
            <>
              <Heading level={3}>Largest shortfalls</Heading>
              <List label="Largest patches short of the spec" style={styles.list} testID="report-coverage-patches">
                {c.patches.slice(0, 5).map((p) => (
                  <Text key={`${p.lon},${p.lat},${p.message}`}>
                    {areaWords(p.areaM2)} at {p.lat.toFixed(5)}, {p.lon.toFixed(5)}: {p.message}
                  </Text>
                ))}
              </List>
            </>
          ) : null}
        </>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({ list: { gap: space.sm } });
