/** One project in the list: name, client, counts and units, with rename and archive for roles that may edit. */
import { StyleSheet, View } from 'react-native';
import type { Project } from '../../contracts/projects';
import { colors, layout, radii, space } from '../theme';
import { Badge, Button, LinkPressable, Text } from '../ui';
import { formatDay } from './format-date';

type ProjectRowProps = {
  project: Project;
  mayWrite: boolean;
  busy: boolean;
  last: boolean;
  onRename: () => void;
  onArchive: (archived: boolean) => void;
};

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The whole text block is a link to the project; the edit buttons sit beside it, not inside it. */
export function ProjectRow({ project, mayWrite, busy, last, onRename, onArchive }: ProjectRowProps) {
  const archived = project.archivedAt !== null;
  return (
    <View role="listitem" style={[styles.row, !last && styles.divider]} testID={`project-${project.name}`}>
      <LinkPressable
        href={`/projects/${project.id}`}
        testID={`project-link-${project.name}`}
        style={(s) => [styles.link, (s.hovered || s.pressed) && styles.linkHover, s.focused && styles.focused]}
      >
        <View style={styles.nameLine}>
          <Text variant="bodyStrong" tone="primary">
            {project.name}
          </Text>
          {archived ? <Badge label="Archived" tone="neutral" testID={`project-archived-${project.name}`} /> : null}
          {project.units === 'imperial' ? <Badge label="ft" tone="info" /> : null}
        </View>
        <Text variant="caption" tone="muted">
          {[project.client || 'No client named', plural(project.siteCount, 'elevation grid', 'elevation grids'), plural(project.planCount, 'plan', 'plans'), `updated ${formatDay(project.updatedAt)}`].join(' · ')}
        </Text>
      </LinkPressable>
      {mayWrite ? (
        <View style={styles.actions}>
          <Button label="Rename" variant="quiet" size="compact" disabled={busy} onPress={onRename} accessibilityLabel={`Rename ${project.name}`} testID={`project-rename-${project.name}`} />
          <Button
            label={archived ? 'Restore' : 'Archive'}
            variant="quiet"
            size="compact"
            disabled={busy}
            onPress={() => onArchive(!archived)}
            accessibilityLabel={`${archived ? 'Restore' : 'Archive'} ${project.name}`}
            testID={`project-archive-${project.name}`}
          />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm, paddingHorizontal: space.lg, paddingVertical: space.md },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  link: { flexGrow: 1, flexShrink: 1, flexBasis: layout.maxFormWidthPx / 2, gap: space.xxs, paddingVertical: space.xs, borderRadius: radii.sm },
  linkHover: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
  nameLine: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  actions: { flexDirection: 'row', gap: space.xs },
});
