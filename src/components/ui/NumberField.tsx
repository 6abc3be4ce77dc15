import type { FieldValues } from 'react-hook-form';
import { TextField, type TextFieldProps } from './TextField';

/** A number input (decimal keypad, any step) with its unit, bound to a form field. */
export function NumberField<T extends FieldValues>(props: TextFieldProps<T>) {
  return <TextField className="input tabular" type="number" inputMode="decimal" step="any" {...props} />;
}
