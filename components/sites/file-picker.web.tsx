/** A button that opens the browser's file chooser through a hidden <input type="file">. */
import { useRef } from 'react';
import { Button, type ButtonVariant } from '../ui';

type FilePickerProps = {
  label: string;
  /** The input's accept list, e.g. ".tif,.tiff,image/tiff". */
  accept: string;
  onPick: (file: File) => void;
  /** With `multiple`, every chosen file at once (a folder's photos); `onPick` then is not called. */
  multiple?: boolean;
  onPickMany?: (files: File[]) => void;
  disabled?: boolean;
  variant?: ButtonVariant;
  size?: 'regular' | 'compact';
  /** The button's test id; the hidden input gets `${testID}-input` (end-to-end tests set files on it). */
  testID?: string;
};

/** The input is reset after each pick, so choosing the same file again still reports it. */
export function FilePicker({ label, accept, onPick, multiple, onPickMany, disabled, variant = 'secondary', size, testID }: FilePickerProps) {
  const input = useRef<HTMLInputElement | null>(null);
  return (
    <>
      <Button label={label} variant={variant} size={size} disabled={disabled} onPress={() => input.current?.click()} testID={testID} />
      <input
        ref={input}
        type="file"
        accept={accept}
        multiple={multiple}
        hidden
        aria-hidden
        tabIndex={-1}
        data-testid={testID ? `${testID}-input` : undefined}
        onChange={(e) => {
          const files = Array.from(e.currentTarget.files ?? []);
          e.currentTarget.value = '';
          if (multiple && onPickMany) {
            if (files.length) onPickMany(files);
          } else if (files[0]) onPick(files[0]);
        }}
      />
    </>
  );
}
