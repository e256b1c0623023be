/** The Loftline mark (a flight line lofted over two hills; drawn by scripts/make-favicon.ts) and the word mark. */
import { Image, StyleSheet, View } from 'react-native';
import { space } from '../theme';
import { Text } from '../ui/text';

const markImage = require('../../assets/brand-mark.png');
const tilePx = { regular: 28, large: 40 } as const;

/** The image is decorative; screen readers read the word "Loftline" beside it. */
export function BrandMark({ size = 'regular' }: { size?: 'regular' | 'large' }) {
  const tile = tilePx[size];
  return (
    <View style={styles.row}>
      <Image source={markImage} aria-hidden alt="" style={{ width: tile, height: tile }} />
      <Text variant={size === 'large' ? 'heading' : 'title'}>Loftline</Text>
    </View>
  );
}

const styles = StyleSheet.create({ row: { flexDirection: 'row', alignItems: 'center', gap: space.sm } });
