/** The notice over a leg sheet shown from the device's copy: when it was loaded, and why the server's answer is missing. */
import { formatDayTime } from '../projects/format-date';
import { StyleSheet } from 'react-native';
import { Banner, Button, Text } from '../ui';
import type { OfflineReason } from './sheet-source';

const why: Record<OfflineReason, string> = {
  checking: 'Checking the server for a newer copy…',
  'no-connection': 'This device has no connection right now.',
  unreachable: 'The Loftline server could not be reached.',
};

/** testID offline-notice; the sheet below it is the last one this device loaded. */
export function OfflineNotice({ savedAt, reason, onRetry, retrying }: { savedAt: string; reason: OfflineReason; onRetry: () => void; retrying: boolean }) {
  return (
    <Banner tone={reason === 'checking' ? 'info' : 'caution'} title={`Offline copy, loaded at ${formatDayTime(savedAt)}`} testID="offline-notice">
      <Text>{why[reason]}</Text>
      {reason === 'checking' ? null : <Button label="Try again" variant="secondary" size="compact" busy={retrying} onPress={onRetry} testID="offline-retry" style={styles.retry} />}
    </Banner>
  );
}

const styles = StyleSheet.create({ retry: { alignSelf: 'flex-start' } });
