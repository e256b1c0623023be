/** The review panel of one plan version: state, send for review, sign off or return with comments, the audit trail. */
import { StyleSheet, View } from 'react-native';
import { can } from '../../contracts/roles';
import { reviewStateLabels, reviewTransitions, type ReviewAction } from '../../contracts/reviews';
import { errorMessage } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { space } from '../theme';
import { Badge, Banner, Button, Card, Heading, Loading, Text, TextField, TextLink } from '../ui';
import { AuditTrail } from './audit-trail';
import { lockedNote, reviewStateNotes, reviewStateTones } from './review-state';
import { useReviewPanel } from './use-review-panel';

type ReviewPanelProps = {
  projectId: string;
  planId: string;
  versionId: string;
  /** False while the analysis is queued, running or failed: such a version cannot be sent for review yet. */
  analysisDone?: boolean;
  /** False on the report page itself. */
  showReportLink?: boolean;
};

const commentLabels: Record<ReviewAction, { label: string; hint: string; confirm: string }> = {
  submit: { label: 'Note for the surveyor (optional)', hint: 'Anything they should look at first.', confirm: 'Send for review' },
  'sign-off': { label: 'Sign-off note (optional)', hint: 'Kept in the audit trail and printed in the report.', confirm: 'Sign off this version' },
  return: { label: 'What should the planner change?', hint: 'Required. The planner receives it by e-mail.', confirm: 'Return with comments' },
};

/** Mounted on the version page; buttons appear only for actions the caller's role holds (the server checks anyway). */
export function ReviewPanel({ projectId, planId, versionId, analysisDone = true, showReportLink = true }: ReviewPanelProps) {
  const p = useReviewPanel({ planId, versionId });
  const review = p.status.data;
  const reportHref = `/projects/${projectId}/plans/${planId}/versions/${versionId}/report`;

  return (
    <Card testID="review-panel">
      <View style={styles.header}>
        <Heading level={2}>Review</Heading>
        {review ? <Badge label={reviewStateLabels[review.reviewState]} tone={reviewStateTones[review.reviewState]} testID="review-state" /> : null}
      </View>
      {p.status.isPending ? <Loading label="Loading the review state…" /> : null}
      {p.status.isError ? <Banner tone="danger" title="Could not load the review state" message={errorMessage(p.status.error)} /> : null}
      {review ? (
        <>
          {review.locked ? (
            <Banner
              tone="success"
              title="Locked"
              testID="review-locked"
              message={`Signed off by ${review.signedOffBy?.name ?? 'a surveyor'} on ${formatDayTime(review.signedOffAt)}. ${lockedNote}`}
            />
          ) : (
            <Text tone="muted" testID="review-note">
              {reviewStateNotes[review.reviewState]}
            </Text>
          )}
          {p.refusal ? <Banner tone="danger" title="Not done" message={p.refusal} testID="review-refused" /> : null}
          {p.notification ? (
            <Banner
              tone={p.notification.status === 'queued' ? 'info' : 'caution'}
              testID="review-notification"
              message={
                p.notification.status === 'queued'
                  ? `E-mail on its way to ${p.notification.recipients.join(', ')}.`
                  : `No e-mail sent: ${p.notification.reason ?? 'nobody to send it to.'}`
              }
            />
          ) : null}
          {p.open ? (
            <View style={styles.form} testID="review-form">
              <TextField
                label={commentLabels[p.open].label}
                hint={commentLabels[p.open].hint}
                value={p.comment}
                onChangeText={p.setComment}
                error={p.commentError ?? undefined}
                multiline
                numberOfLines={4}
                // The button that opened the form is gone; the note is where the user goes next.
                autoFocus
                testID="review-comment"
              />
              {p.unmet.length ? (
                <View style={styles.form} testID="review-reasons">
                  <Banner
                    tone="caution"
                    title={`This version does not meet ${p.unmet.length === 1 ? 'one requirement' : `${p.unmet.length} requirements`} of the spec`}
                    message="Signing off anyway needs a reason for each, printed in the report and its PDF under your name. Otherwise, return the version to the planner."
                  />
                  {p.unmet.map((u) => (
                    <TextField
                      key={u.key}
                      label={`Reason: ${u.label}`}
                      hint={`Required ${u.required}; achieved ${u.achieved}.`}
                      value={p.reasons[u.key] ?? ''}
                      onChangeText={(t) => p.setReason(u.key, t)}
                      error={p.reasonErrors[u.key]}
                      multiline
                      numberOfLines={2}
                      testID={`review-reason-${u.key}`}
                    />
                  ))}
                </View>
              ) : null}
              <View style={styles.buttons}>
                <Button
                  label={commentLabels[p.open].confirm}
                  variant={p.open === 'return' ? 'danger' : 'primary'}
                  busy={p.busy}
                  onPress={() => void p.confirm()}
                  testID="review-confirm"
                />
                <Button label="Cancel" variant="quiet" onPress={p.cancel} disabled={p.busy} testID="review-cancel" />
              </View>
            </View>
          ) : review.allowedActions.length > 0 ? (
            <View style={styles.buttons}>
              {review.allowedActions.map((action) => {
                const blocked = action === 'submit' && !analysisDone;
                return (
                  <Button
                    key={action}
                    label={reviewTransitions[action].label}
                    variant={action === 'return' ? 'secondary' : 'primary'}
                    disabled={blocked}
                    onPress={() => p.start(action)}
                    testID={`review-${action}`}
                  />
                );
              })}
            </View>
          ) : null}
          {review.allowedActions.includes('submit') && !analysisDone ? (
            <Text variant="label" tone="muted">
              The analysis has to finish before this version can be sent for review.
            </Text>
          ) : null}
        </>
      ) : null}
      {showReportLink && can(p.role, 'report:read') ? <TextLink href={reportHref} label="Open the compliance report" testID="review-report-link" /> : null}
      <Heading level={3}>Audit trail</Heading>
      {p.audit.isPending ? <Loading label="Loading the audit trail…" /> : null}
      {p.audit.isError ? <Banner tone="danger" message={errorMessage(p.audit.error)} /> : null}
      {p.audit.data ? <AuditTrail events={p.audit.data} currentVersionId={versionId} /> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  header: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  form: { gap: space.md },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
