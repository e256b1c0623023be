/** The Loftline mark (a flight line lofted over two hills; drawn by scripts/make-favicon.ts) and the word mark. */
import { Image, StyleSheet, View } from 'react-native';
import { space } from '../theme';
import { Text } from '../ui/text';

const markImage = require('../../assets/brand-mark.png');
const tilePx = { regular: 28, large: 40 } as const;

/** The image is decorative beside the word; `markOnly` (narrow top bar) gives the image the name instead. */
export function BrandMark({ size = 'regular', markOnly = false }: { size?: 'regular' | 'large'; markOnly?: boolean }) {
  const tile = tilePx[size];
  return (
    <View style={styles.row}>
      <Image
        source={markImage}
        aria-hidden={!markOnly}
        alt={markOnly ? 'Loftline' : ''}
        style={{ width: tile, height: tile }}
      />
      {markOnly ? null : <Text variant={size === 'large' ? 'heading' : 'title'}>Loftline</Text>}
    </View>
  );
}

const styles = StyleSheet.create({ row: { flexDirection: 'row', alignItems: 'center', gap: space.sm } });
