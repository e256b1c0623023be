/**
 * After the flight, on a signed-off version: confirm it as flown against the latest check of its photos, with a
 * reason for each spec item the flight lost against the plan. Where the team's rule requires it, the review is
 * complete only once this is done; the report and its PDF say which.
 */
import { StyleSheet, View } from 'react-native';
import { shareWords } from '../../contracts/coverage-words';
import { errorMessage } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Banner, Button, Card, Heading, Loading, Text, TextField } from '../ui';
import { useFlownConfirmation } from './use-flown-confirmation';

/** testIDs: flown-card, flown-state, flown-open, flown-reason-KEY, flown-confirm, flown-refused. */
export function FlownConfirmationCard({ planId, versionId }: { planId: string; versionId: string }) {
  const f = useFlownConfirmation({ planId, versionId });
  const s = f.status.data;
  return (
    <Card testID="flown-card">
      <Heading level={2}>Confirm as flown</Heading>
      {f.status.isPending ? <Loading label="Loading the confirmation as flown…" /> : null}
      {f.status.isError ? <Banner tone="danger" message={errorMessage(f.status.error)} /> : null}
      {s ? (
        <View style={styles.body}>
          <Text tone="muted">
            {s.required
              ? 'Your team requires it: a signed-off version\u2019s review is complete once a surveyor confirms it against a check of the flight\u2019s photos.'
              : 'After the flight, a surveyor may confirm the version against a check of its photos; the report then says so. (Your team does not require it.)'}
          </Text>
          {s.confirmedAt ? (
            <Banner tone="success" title="Confirmed as flown" testID="flown-state"
              message={`By ${s.confirmedBy?.name ?? 'a former member'} on ${formatDayTime(s.confirmedAt)}${s.check ? `, against "${s.check.label}" (${s.check.photoCount} photos; whole spec met on ${shareWords(s.check.shareAllFlown)} of the area as flown, ${shareWords(s.check.shareAllPlanned)} as planned)` : ''}.`} />
          ) : (
            <Text variant="bodyStrong" tone={s.required ? 'caution' : undefined} testID="flown-state">
              {s.blockedBecause && !s.mayConfirm ? `Not confirmed as flown. ${s.blockedBecause}` : 'Not confirmed as flown yet.'}
            </Text>
          )}
          {s.reasons.length ? (
            <View style={styles.body}>
              <Text variant="bodyStrong" tone="caution">Confirmed although the flight lost ground on:</Text>
              {s.reasons.map((r) => <Text key={r.key}>{r.label}: {r.reason}</Text>)}
            </View>
          ) : null}
          {f.refusal ? <Banner tone="danger" title="Not confirmed" message={f.refusal} testID="flown-refused" /> : null}
          {s.mayConfirm && s.check && !f.open ? (
            <Button label="Confirm as flown…" onPress={() => f.setOpen(true)} testID="flown-open" />
          ) : null}
          {s.mayConfirm && s.check && f.open ? (
            <View style={styles.body} testID="flown-form">
              <Text>
                Against the latest check, {s.check.label} ({s.check.photoCount} photos, {formatDayTime(s.check.checkedAt)}): whole spec met on{' '}
                {shareWords(s.check.shareAllFlown)} of the area as flown, {shareWords(s.check.shareAllPlanned)} as planned.
              </Text>
              {s.shortfalls.length ? (
                <Banner tone="caution" title={`The flight lost ground on ${s.shortfalls.length === 1 ? 'one item' : `${s.shortfalls.length} items`} of the spec`}
                  message="Confirming anyway needs a reason for each (for example: re-flown and checked again), printed in the report under your name. Otherwise re-fly and check the photos again." />
              ) : null}
              {s.shortfalls.map((x) => (
                <TextField key={x.key} label={`Reason: ${x.label}`} hint={`${shareWords(x.flown)} of the area as flown; ${shareWords(x.planned)} as planned.`}
                  value={f.reasons[x.key] ?? ''} onChangeText={(t) => f.setReason(x.key, t)} error={f.reasonErrors[x.key]} multiline numberOfLines={2} testID={`flown-reason-${x.key}`} />
              ))}
              <TextField label="Note (optional)" hint="Kept in the audit trail." value={f.comment} onChangeText={f.setComment} multiline numberOfLines={2} testID="flown-comment" />
              <View style={styles.buttons}>
                <Button label="Confirm as flown" busy={f.busy} onPress={() => void f.confirm()} testID="flown-confirm" />
                <Button label="Cancel" variant="quiet" disabled={f.busy} onPress={() => f.setOpen(false)} testID="flown-cancel" />
              </View>
            </View>
          ) : null}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
