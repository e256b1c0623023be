/** One member of the team: name, e-mail and role, with role choices and removal for owners. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { roleLabels, roles, type Role } from '../../contracts/roles';
import type { Member } from '../../contracts/teams';
import { colors, layout, space } from '../theme';
import { Badge, Button, ChoiceGroup, Text } from '../ui';

const roleChoices = roles.map((role) => ({ value: role, label: roleLabels[role] }));

export type MemberRowProps = {
  member: Member;
  isSelf: boolean;
  manage: boolean;
  busy: boolean;
  onRoleChange: (role: Role) => void;
  onRemove: () => void;
  last: boolean;
};

/** Removal asks once more in place (no modal), so a slip of the finger outdoors costs nothing. */
export function MemberRow({ member, isSelf, manage, busy, onRoleChange, onRemove, last }: MemberRowProps) {
  const [confirming, setConfirming] = useState(false);
  return (
    <View role="listitem" testID={`member-${member.email}`} style={[styles.row, !last && styles.divider]}>
      <View style={styles.who}>
        <View style={styles.nameLine}>
          <Text variant="bodyStrong">{member.name}</Text>
          {isSelf ? <Badge label="You" tone="info" /> : null}
          {manage ? null : <Badge label={roleLabels[member.role]} tone="primary" testID={`member-role-${member.email}`} />}
        </View>
        <Text variant="caption" tone="muted">
          {member.email}
        </Text>
      </View>
      {manage ? (
        <View style={styles.controls}>
          <ChoiceGroup
            label={`Role of ${member.name}`}
            choices={roleChoices}
            value={member.role}
            onChange={onRoleChange}
            disabled={busy}
            testID={`member-role-${member.email}`}
          />
          {confirming ? (
            <View style={styles.confirm}>
              <Text variant="caption">Remove {member.name} from the team?</Text>
              <Button
                label="Remove"
                variant="danger"
                size="compact"
                busy={busy}
                accessibilityLabel={`Confirm removing ${member.name}`}
                testID={`member-remove-confirm-${member.email}`}
                onPress={() => {
                  setConfirming(false);
                  onRemove();
                }}
              />
              <Button label="Keep" variant="quiet" size="compact" onPress={() => setConfirming(false)} />
            </View>
          ) : (
            <Button
              label="Remove"
              variant="quiet"
              size="compact"
              disabled={busy}
              accessibilityLabel={`Remove ${member.name}`}
              testID={`member-remove-${member.email}`}
              onPress={() => setConfirming(true)}
              style={styles.removeButton}
            />
          )}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { padding: space.lg, gap: space.md },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  who: { gap: space.xxs },
  nameLine: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  controls: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.md },
  confirm: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  removeButton: { alignSelf: 'flex-start' },
});
