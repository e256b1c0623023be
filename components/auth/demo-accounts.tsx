/** A discreet list of the demo team's accounts on the sign-in page (the product ships with an invented demo team). */
import { Pressable, StyleSheet, View } from 'react-native';
import { demoUsers } from '../../contracts/demo-team';
import { roleLabels } from '../../contracts/roles';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';

/** The seeded demo users (fictional people on the reserved .example domain), from the one list the seed uses. */
const demoAccounts = demoUsers;

/**
 * Tapping an account fills in its e-mail; nothing is submitted on the user's behalf. The shared password is not in
 * the web bundle: it is in the README and in what the server prints when it starts.
 */
export function DemoAccounts({ onPick }: { onPick: (email: string) => void }) {
  return (
    <View style={styles.box} testID="demo-accounts">
      <Text variant="label" tone="muted">
        Demo accounts — team “Brackenmoor Aerial Mapping”; the password is in the README and in the server's start-up output
      </Text>
      {demoAccounts.map((account) => (
        <Pressable
          key={account.role}
          role="button"
          testID={`demo-${account.role}`}
          onPress={() => onPick(account.email)}
          style={styles.row}
        >
          <Text variant="caption" tone="muted" style={styles.role}>
            {roleLabels[account.role]}
          </Text>
          <Text variant="caption" tone="primary" style={styles.email}>
            {account.email}
          </Text>
        </Pressable>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: layout.borderWidthPx,
    borderColor: colors.line,
    backgroundColor: colors.surfaceSunken,
  },
  row: { flexDirection: 'row', gap: space.sm, paddingVertical: space.xxs, alignItems: 'baseline' },
  role: { minWidth: layout.inlineLabelPx },
  email: { flexShrink: 1, textDecorationLine: 'underline' },
});
