/** The development outbox for owners: what the fake SMTP server received (to, subject, time, attachments, text). */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { OutboxMessage } from '../../contracts/outbox';
import { errorMessage } from '../api/api-error';
import { can } from '../../contracts/roles';
import { formatDayTime } from '../projects/format-date';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, radii, space } from '../theme';
import { Badge, Banner, Button, Card, EmptyState, Loading, Screen, Text } from '../ui';
import { formatBytes } from '../../contracts/format/bytes';
import { isOutboxOff, useOutbox } from './outbox.queries';

/** Route /outbox. Nothing here leaves the machine: the fake server only stores what it is sent. */
export function OutboxScreen() {
  const { team, role } = useCurrentTeam();
  const outbox = useOutbox(team?.id, can(role, 'outbox:read'));
  return (
    <Screen title="Development outbox" subtitle="Mail this server would have sent, caught by its built-in test mail server." testID="outbox-screen">
      <RequirePermission permission="outbox:read" what="The development outbox">
        <Banner tone="info" message="Development only: with SMTP_HOST set, mail goes out for real and this page is switched off." />
        {outbox.isPending ? <Loading label="Loading the outbox…" /> : null}
        {outbox.isError ? (
          isOutboxOff(outbox.error) ? (
            <EmptyState testID="outbox-off" title="The outbox is off" message={errorMessage(outbox.error)} />
          ) : (
            <Banner tone="danger" title="Could not load the outbox" message={errorMessage(outbox.error)}>
              <Button label="Try again" variant="secondary" size="compact" onPress={() => void outbox.refetch()} />
            </Banner>
          )
        ) : null}
        {outbox.data && outbox.data.length === 0 ? <EmptyState testID="outbox-empty" title="No mail yet" message="Invitations and review mail appear here when they are sent." /> : null}
        {outbox.data && outbox.data.length > 0 ? (
          <View style={styles.list} role="list" aria-label="Received mail" testID="outbox-list">
            {outbox.data.map((m) => (
              <MessageCard key={m.id} message={m} />
            ))}
          </View>
        ) : null}
        {outbox.data ? <Button label="Refresh" variant="secondary" onPress={() => void outbox.refetch()} busy={outbox.isFetching} style={styles.refresh} testID="outbox-refresh" /> : null}
      </RequirePermission>
    </Screen>
  );
}

function MessageCard({ message: m }: { message: OutboxMessage }) {
  const [open, setOpen] = useState(false);
  return (
    <Card testID={`outbox-message-${m.id}`}>
      <View role="listitem" style={styles.item}>
        <Text variant="bodyStrong" testID="outbox-subject">
          {m.subject}
        </Text>
        <Text variant="label" tone="muted">
          To {m.to.join(', ')} · {formatDayTime(m.receivedAt)}
        </Text>
        <Text variant="label" tone="muted">
          From {m.from}
        </Text>
        {m.attachments.length ? (
          <View style={styles.attachments}>
            {m.attachments.map((a) => (
              <Badge key={a.filename} label={`${a.filename} · ${a.contentType} · ${formatBytes(a.size)}`} tone="info" testID={`outbox-attachment-${a.filename}`} />
            ))}
          </View>
        ) : null}
        <Button label={open ? 'Hide the text' : 'Show the text'} variant="quiet" size="compact" onPress={() => setOpen(!open)} style={styles.toggle} />
        {open ? (
          <View style={styles.body}>
            <Text variant="mono" selectable>
              {m.text}
            </Text>
          </View>
        ) : null}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  item: { gap: space.xs },
  attachments: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  toggle: { alignSelf: 'flex-start' },
  body: { padding: space.md, borderRadius: radii.md, backgroundColor: colors.canvas, borderWidth: layout.borderWidthPx, borderColor: colors.line },
  refresh: { alignSelf: 'flex-start' },
});
