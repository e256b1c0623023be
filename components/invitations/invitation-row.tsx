/** One invitation in the owner's list: address, role, status, expiry, and revoking with a second tap to confirm. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { Invitation } from '../../contracts/invitations';
import { roleLabels } from '../../contracts/roles';
import { formatDay } from '../projects/format-date';
import { colors, layout, space } from '../theme';
import { Badge, Button, Text } from '../ui';
import { invitationStatusLabels } from './invitation-status';

/** testIDs invitation-<email>, invitation-revoke-<email>, invitation-revoke-confirm-<email>. */
export function InvitationRow({ invitation: inv, busy, onRevoke, last }: { invitation: Invitation; busy: boolean; onRevoke: () => void; last: boolean }) {
  const [confirming, setConfirming] = useState(false);
  const status = invitationStatusLabels[inv.status];
  return (
    <View role="listitem" testID={`invitation-${inv.email}`} style={[styles.row, !last && styles.divider]}>
      <View style={styles.who}>
        <View style={styles.line}>
          <Text variant="bodyStrong">{inv.email}</Text>
          <Badge label={roleLabels[inv.role]} tone="primary" />
          <Badge label={status.label} tone={status.tone} testID={`invitation-status-${inv.email}`} />
        </View>
        <Text variant="label" tone="muted">
          {inv.status === 'pending' ? `Expires ${formatDay(inv.expiresAt)}` : `Sent ${formatDay(inv.createdAt)}`}
          {inv.invitedBy ? ` · invited by ${inv.invitedBy}` : ''}
        </Text>
        {inv.link ? (
          <Text variant="caption" tone="muted" selectable>
            {inv.link}
          </Text>
        ) : null}
      </View>
      {inv.status === 'pending' ? (
        <View style={styles.controls}>
          {confirming ? (
            <>
              <Button label="Revoke it" variant="danger" size="compact" busy={busy} onPress={onRevoke} accessibilityLabel={`Revoke the invitation for ${inv.email}`} testID={`invitation-revoke-confirm-${inv.email}`} />
              <Button label="Keep" variant="quiet" size="compact" onPress={() => setConfirming(false)} />
            </>
          ) : (
            <Button label="Revoke" variant="secondary" size="compact" onPress={() => setConfirming(true)} accessibilityLabel={`Revoke the invitation for ${inv.email}`} testID={`invitation-revoke-${inv.email}`} />
          )}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.md, paddingVertical: space.md },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  who: { flexShrink: 1, flexGrow: 1, flexBasis: layout.maxFormWidthPx / 2, gap: space.xxs },
  line: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  controls: { flexDirection: 'row', gap: space.sm },
});
