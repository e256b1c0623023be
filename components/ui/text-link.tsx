/** Text-link atom: an in-app link rendered as an anchor on the web. */
import { Link, type Href } from 'expo-router';
import { StyleSheet } from 'react-native';
import { colors, typeScale } from '../theme';

/** An underlined link in the primary colour, for navigation inside running text. */
export function TextLink({ href, label, testID }: { href: Href; label: string; testID?: string }) {
  return (
    <Link href={href} testID={testID} style={styles.link}>
      {label}
    </Link>
  );
}

const styles = StyleSheet.create({
  link: { ...typeScale.bodyStrong, color: colors.primary, textDecorationLine: 'underline' },
});
