/** The versions of a plan: number, analysis state and review state, each a link to its results. */
import { StyleSheet, View } from 'react-native';
import { reviewStateLabels } from '../../contracts/reviews';
import { formatDayTime } from '../projects/format-date';
import { colors, layout, space } from '../theme';
import { Badge, type BadgeTone, LinkPressable, List, Text } from '../ui';
import { analysisStateLabels, type AnalysisState, type VersionSummary } from './plan-shape';

const tones: Record<AnalysisState, BadgeTone> = { queued: 'neutral', running: 'info', done: 'success', failed: 'danger' };

/** Label and badge tone of each analysis state. */
export const analysisLabels = Object.fromEntries(
  (Object.keys(tones) as AnalysisState[]).map((s) => [s, { label: analysisStateLabels[s], tone: tones[s] }]),
) as Record<AnalysisState, { label: string; tone: BadgeTone }>;

export function VersionsList({ projectId, versions }: { projectId: string; versions: VersionSummary[] }) {
  if (versions.length === 0) {
    return <Text tone="muted">No runs yet. Run the analysis to make version 1.</Text>;
  }
  return (
    <List label="Versions" testID="versions-list">
      {versions.map((v, i) => (
        <LinkPressable
          key={v.id}
          href={`/projects/${projectId}/plans/${v.planId}/versions/${v.id}`}
          testID={`version-${v.number}`}
          style={(s) => [styles.row, i < versions.length - 1 && styles.divider, (s.hovered || s.pressed) && styles.hover]}
        >
          <Text variant="bodyStrong" tone="primary">Version {v.number}</Text>
          <Badge label={analysisLabels[v.analysisState].label} tone={analysisLabels[v.analysisState].tone} />
          <Badge label={reviewStateLabels[v.reviewState]} tone="neutral" />
          <Text variant="caption" tone="muted">{formatDayTime(v.createdAt)}</Text>
        </LinkPressable>
      ))}
    </List>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm, paddingVertical: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  hover: { backgroundColor: colors.surfaceSunken },
});
