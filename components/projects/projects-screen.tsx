/** The current team's projects: search, sort, archived filter; planners and owners create, rename and archive. */
import { StyleSheet, View } from 'react-native';
import { errorMessage } from '../api/api-error';
import { RequirePermission } from '../team/require-permission';
import { space } from '../theme';
import { Banner, Button, Card, ChoiceGroup, EmptyState, Heading, Loading, Screen, TextField } from '../ui';
import { ProjectForm } from './project-form';
import { ProjectRow } from './project-row';
import { useProjectsScreen, type ArchivedChoice, type SortChoice } from './use-projects-screen';

const sortChoices: { value: SortChoice; label: string }[] = [
  { value: 'updated', label: 'Recently updated' },
  { value: 'name', label: 'Name A–Z' },
  { value: 'created', label: 'Newest' },
];
const archivedChoices: { value: ArchivedChoice; label: string }[] = [
  { value: 'active', label: 'Active' },
  { value: 'archived', label: 'Archived' },
  { value: 'all', label: 'All' },
];

/** Everyone who reads projects sees the list; only project:write roles see the edit controls. */
export function ProjectsScreen() {
  const s = useProjectsScreen();
  const list = s.projects.data ?? [];
  const editing = list.find((p) => p.id === s.editingId) ?? null;
  return (
    <Screen
      title="Projects"
      subtitle={s.team ? `Survey jobs of ${s.team.name}` : undefined}
      testID="projects-screen"
      actions={s.mayWrite && !s.creating ? <Button label="New project" onPress={() => s.setCreating(true)} testID="new-project" /> : null}
    >
      <RequirePermission permission="project:read" what="Projects">
        {s.creating ? (
          <Card testID="new-project-card">
            <Heading level={2}>New project</Heading>
            <ProjectForm
              submitLabel="Create project"
              onCancel={() => s.setCreating(false)}
              onSubmit={async (values) => {
                await s.create.mutateAsync(values);
                s.setCreating(false);
              }}
            />
          </Card>
        ) : null}
        {editing ? (
          <Card testID="edit-project-card">
            <Heading level={2}>Rename {editing.name}</Heading>
            <ProjectForm
              key={editing.id}
              testID="edit-project-form"
              initial={editing}
              submitLabel="Save"
              onCancel={() => s.setEditingId(null)}
              onSubmit={async (values) => {
                await s.update.mutateAsync({ projectId: editing.id, change: values });
                s.setEditingId(null);
              }}
            />
          </Card>
        ) : null}
        <View style={styles.toolbar}>
          <TextField label="Search" placeholder="Project or client name" value={s.search} onChangeText={s.setSearch} testID="projects-search" autoCorrect={false} />
          <View style={styles.choices}>
            <ChoiceGroup label="Sort projects" choices={sortChoices} value={s.sort} onChange={s.setSort} testID="projects-sort" />
            <ChoiceGroup label="Show projects" choices={archivedChoices} value={s.archived} onChange={s.setArchived} testID="projects-archived" />
          </View>
        </View>
        {s.refusal ? <Banner tone="danger" title="That change was not made" message={s.refusal} testID="project-change-refused" /> : null}
        {s.projects.isPending ? <Loading label="Loading projects…" /> : null}
        {s.projects.isError ? (
          <Banner tone="danger" title="Could not load the projects" message={errorMessage(s.projects.error)}>
            <Button label="Try again" variant="secondary" size="compact" onPress={() => void s.projects.refetch()} style={styles.retry} />
          </Banner>
        ) : null}
        {s.projects.isSuccess && list.length === 0 ? (
          <EmptyState
            testID="projects-empty"
            title={s.filtered ? 'No projects match' : 'No projects yet'}
            message={
              s.filtered
                ? 'Change the search text or the filter above.'
                : s.mayWrite
                  ? 'A project holds one job for one client: its elevation uploads, flight plans and reviews.'
                  : 'When a planner creates a project for this team it will appear here.'
            }
            action={s.mayWrite && !s.filtered && !s.creating ? <Button label="New project" onPress={() => s.setCreating(true)} testID="new-project-empty" /> : null}
          />
        ) : null}
        {list.length > 0 ? (
          <Card padded={false}>
            <View role="list" aria-label="Projects" testID="projects-list">
              {list.map((project, i) => (
                <ProjectRow
                  key={project.id}
                  project={project}
                  mayWrite={s.mayWrite}
                  busy={s.update.isPending}
                  last={i === list.length - 1}
                  onRename={() => s.setEditingId(project.id)}
                  onArchive={(archived) => {
                    s.setRefusal(null);
                    s.update.mutate({ projectId: project.id, change: { archived } }, { onError: (e) => s.setRefusal(errorMessage(e)) });
                  }}
                />
              ))}
            </View>
          </Card>
        ) : null}
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({
  toolbar: { gap: space.md },
  choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  retry: { alignSelf: 'flex-start' },
});
