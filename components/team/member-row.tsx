/** One member of the team: name, e-mail and role, with role choices and removal for owners. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { roleLabels, roleSummaries, roles, type Role } from '../../contracts/roles';
import type { Member } from '../../contracts/teams';
import { colors, layout, space } from '../theme';
import { Badge, Button, ChoiceGroup, Text } from '../ui';

const roleChoices = roles.map((role) => ({ value: role, label: roleLabels[role] }));

type MemberRowProps = {
  member: Member;
  isSelf: boolean;
  manage: boolean;
  busy: boolean;
  onRoleChange: (role: Role) => void;
  onRemove: () => void;
  last: boolean;
};

/**
 * A new role and removal each ask once more in place (no modal), so a slip of the finger outdoors costs nothing: the
 * picker only proposes the role, and nothing changes until the owner confirms it.
 */
export function MemberRow({ member, isSelf, manage, busy, onRoleChange, onRemove, last }: MemberRowProps) {
  const [confirming, setConfirming] = useState(false);
  const [proposed, setProposed] = useState<Role | null>(null);
  const picked = proposed ?? member.role;
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
            value={picked}
            onChange={(role) => setProposed(role === member.role ? null : role)}
            disabled={busy}
            testID={`member-role-${member.email}`}
          />
          {proposed ? (
            <View style={styles.roleConfirm} testID={`member-role-confirm-${member.email}`}>
              <Text variant="caption">
                Make {member.name} {roleLabels[proposed].toLowerCase()} instead of {roleLabels[member.role].toLowerCase()}? {roleSummaries[proposed]}
              </Text>
              <View style={styles.confirm}>
                <Button
                  label={`Make ${roleLabels[proposed].toLowerCase()}`}
                  size="compact"
                  busy={busy}
                  accessibilityLabel={`Confirm: make ${member.name} ${roleLabels[proposed].toLowerCase()}`}
                  testID={`member-role-apply-${member.email}`}
                  onPress={() => {
                    setProposed(null);
                    onRoleChange(proposed);
                  }}
                />
                <Button label={`Keep ${roleLabels[member.role].toLowerCase()}`} variant="quiet" size="compact" onPress={() => setProposed(null)} testID={`member-role-keep-${member.email}`} />
              </View>
            </View>
          ) : null}
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
  // The question takes the row's whole width so it wraps on a phone, with its two answers under it.
  roleConfirm: { flexBasis: '100%', flexShrink: 1, gap: space.sm },
  removeButton: { alignSelf: 'flex-start' },
});
