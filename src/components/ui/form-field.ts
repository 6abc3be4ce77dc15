import type { Control, FieldPath, FieldValues } from 'react-hook-form';

/** A field component bound by name to a React Hook Form form. */
export interface BoundField<T extends FieldValues> {
  // What the form's resolver makes of the values on submit doesn't matter to a field.
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  control: Control<T, any, any>;
  name: FieldPath<T>;
}

/** A field's aria-describedby: the ids of its hint and its error, when shown. */
export const describedBy = (id: string, hint?: string, error?: string) => [hint && `${id}-hint`, error && `${id}-error`].filter(Boolean).join(' ') || undefined;
