/** A numeric form field for react-hook-form: keeps the typed text, hands the form a number (or NaN for "not a number"). */
import { useEffect, useState } from 'react';
import { type Control, type FieldPath, type FieldValues, useController } from 'react-hook-form';
import { TextField } from '../ui';
import { numberToText, parseNumberText, scaleRangeMessage } from './number-text';
import { fieldMessage } from './plan-form-schema';

type NumberFieldProps<T extends FieldValues> = {
  control: Control<T>;
  name: FieldPath<T>;
  label: string;
  /** Unit shown after the label, e.g. "m" or "%". */
  unit?: string;
  hint?: string;
  /** 100 shows a fraction as a percentage. */
  scale?: number;
  testID?: string;
  disabled?: boolean;
};

/** The schema's own message is shown under the field; text that is not a number gets a plain "Enter a number". */
export function NumberField<T extends FieldValues>({ control, name, label, unit, hint, scale = 1, testID, disabled }: NumberFieldProps<T>) {
  const { field, fieldState } = useController({ control, name });
  const [text, setText] = useState(() => numberToText(field.value as number | undefined, scale));

  // Follow values set from outside (a preset, a reset) without fighting the person typing.
  useEffect(() => {
    const typed = parseNumberText(text, scale);
    const v = field.value as number | undefined;
    if (!(typed === v || (Number.isNaN(typed) && Number.isNaN(v)))) setText(numberToText(v, scale));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [field.value, scale]);

  const typed = parseNumberText(text, scale);
  const error = fieldState.error ? (Number.isNaN(typed) ? `Enter a number${unit ? ` in ${unit}` : ''}.` : scaleRangeMessage(fieldMessage(fieldState.error.message) ?? '', scale, unit)) : undefined;
  return (
    <TextField
      ref={field.ref}
      label={unit ? `${label} (${unit})` : label}
      hint={hint}
      value={text}
      inputMode="decimal"
      editable={!disabled}
      onChangeText={(t) => {
        setText(t);
        field.onChange(parseNumberText(t, scale));
      }}
      onBlur={field.onBlur}
      error={error}
      testID={testID}
    />
  );
}
