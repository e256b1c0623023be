/** A button that opens the browser's file chooser through a hidden <input type="file">. */
import { useRef } from 'react';
import { Button, type ButtonVariant } from '../ui';

export type FilePickerProps = {
  label: string;
  /** The input's accept list, e.g. ".tif,.tiff,image/tiff". */
  accept: string;
  onPick: (file: File) => void;
  disabled?: boolean;
  variant?: ButtonVariant;
  size?: 'regular' | 'compact';
  /** The button's test id; the hidden input gets `${testID}-input` (end-to-end tests set files on it). */
  testID?: string;
};

/** The input is reset after each pick, so choosing the same file again still reports it. */
export function FilePicker({ label, accept, onPick, disabled, variant = 'secondary', size, testID }: FilePickerProps) {
  const input = useRef<HTMLInputElement | null>(null);
  return (
    <>
      <Button label={label} variant={variant} size={size} disabled={disabled} onPress={() => input.current?.click()} testID={testID} />
      <input
        ref={input}
        type="file"
        accept={accept}
        hidden
        aria-hidden
        tabIndex={-1}
        data-testid={testID ? `${testID}-input` : undefined}
        onChange={(e) => {
          const file = e.currentTarget.files?.[0];
          e.currentTarget.value = '';
          if (file) onPick(file);
        }}
      />
    </>
  );
}
