/** The team's rules: every member sees them (they say what a version still needs after sign-off); owners change them. */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { StyleSheet, View } from 'react-native';
import { teamSettingsSchema } from '../../contracts/flown-confirmation';
import { apiFetch } from '../api/api-fetch';
import { errorMessage } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Banner, Card, ChoiceGroup, Heading, Loading, Text } from '../ui';

const path = (teamId: string) => `/api/teams/${encodeURIComponent(teamId)}/settings`;
const key = (teamId: string) => ['team-settings', teamId] as const;

/** testIDs: team-rules, team-rule-flown. */
export function TeamRulesCard({ teamId, mayChange }: { teamId: string; mayChange: boolean }) {
  const queryClient = useQueryClient();
  const settings = useQuery({ queryKey: key(teamId), queryFn: ({ signal }) => apiFetch(path(teamId), { schema: teamSettingsSchema, signal }) });
  const save = useMutation({
    mutationFn: (requireFlownConfirmation: boolean) => apiFetch(path(teamId), { method: 'PATCH', body: { requireFlownConfirmation }, schema: teamSettingsSchema }),
    onSuccess: (s) => {
      queryClient.setQueryData(key(teamId), s);
      return queryClient.invalidateQueries({ queryKey: ['reviews', teamId] });
    },
  });
  const s = settings.data;
  return (
    <Card testID="team-rules">
      <Heading level={2}>Team rules</Heading>
      {settings.isPending ? <Loading label="Loading the team's rules…" /> : null}
      {settings.isError ? <Banner tone="danger" message={errorMessage(settings.error)} /> : null}
      {s ? (
        <View style={styles.body}>
          <Text variant="bodyStrong">Confirm every signed-off version as flown</Text>
          <Text tone="muted">
            When on, a signed-off version&apos;s review is complete only once a surveyor confirms it against a check of the flight&apos;s photos, with a
            reason for any ground the flight lost; until then its report says the confirmation is owed.
          </Text>
          {mayChange ? (
            <ChoiceGroup
              label="Confirm every signed-off version as flown"
              choices={[{ value: 'on', label: 'Required' }, { value: 'off', label: 'Not required' }]}
              value={s.requireFlownConfirmation ? 'on' : 'off'}
              onChange={(v) => save.mutate(v === 'on')}
              disabled={save.isPending}
              testID="team-rule-flown"
            />
          ) : (
            <Text testID="team-rule-flown">{s.requireFlownConfirmation ? 'Required.' : 'Not required.'}</Text>
          )}
          {s.updatedAt ? <Text variant="label" tone="muted">Last changed by {s.updatedBy?.name ?? 'a former member'} on {formatDayTime(s.updatedAt)}.</Text> : null}
          {save.isError ? <Banner tone="danger" title="Not changed" message={errorMessage(save.error)} /> : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({ body: { gap: space.sm } });
