/** Native builds have no file chooser yet; Loftline ships for the web (see file-picker.web.tsx). */
import { Button, type ButtonVariant } from '../ui';

type FilePickerProps = {
  label: string;
  accept: string;
  onPick: (file: File) => void;
  /** With `multiple`, every chosen file at once (a folder's photos); `onPick` then is not called. */
  multiple?: boolean;
  onPickMany?: (files: File[]) => void;
  disabled?: boolean;
  variant?: ButtonVariant;
  size?: 'regular' | 'compact';
  testID?: string;
};

/** A disabled button that says why. */
export function FilePicker({ label, variant = 'secondary', size, testID }: FilePickerProps) {
  return <Button label={label} variant={variant} size={size} disabled accessibilityLabel={`${label} (only in the web app)`} testID={testID} />;
}
