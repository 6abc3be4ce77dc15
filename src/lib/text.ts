import * as z from 'zod/mini';

/**
 * The rules every free-text field follows (titles, names, notes, file names): text a person can
 * read back as it was meant. Written with zod's small build so the form islands can ship it; its
 * check works in full zod schemas too (`.check(plainText())`).
 */

export type Lines = 'single' | 'multi';

/** C0 and C1 controls and DEL (general category Cc), except what a multi-line note may keep. */
// eslint-disable-next-line no-control-regex -- matching control characters is the point
const CONTROL = /[\u0000-\u001F\u007F-\u009F]/u;
// eslint-disable-next-line no-control-regex -- as above
const CONTROL_BUT_LINES = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/u;
/** Line and paragraph separators: line breaks that are not controls. */
const LINE_SEPARATORS = /[\u2028\u2029]/u;
/** Explicit embeddings, overrides (U+202A–U+202E) and isolates (U+2066–U+2069). */
const DIRECTION_CONTROLS = /[\u202A-\u202E\u2066-\u2069]/u;
/** A lone surrogate: half of a character, not text. */
const LONE_SURROGATE = /\p{Cs}/u;
/** Characters that show nothing: white space, default-ignorable (zero-width, joiners, fillers, BOM) and the braille blank. */
const INVISIBLE = /^[\p{White_Space}\p{Default_Ignorable_Code_Point}\u2800]+$/u;

/** Why a text is refused, in words for the person who typed it; null when it is fine (the empty text included). */
export function textFault(value: string, lines: Lines): string | null {
  if (LONE_SURROGATE.test(value)) return 'Remove the broken characters: part of the text was lost on its way here.';
  if (value.includes('\uFFFD')) return 'Remove the � (U+FFFD): part of the text was lost on its way here.';
  if (DIRECTION_CONTROLS.test(value)) return 'Remove the characters that change the writing direction (U+202A–U+202E, U+2066–U+2069).';
  if (lines === 'single' && (CONTROL.test(value) || LINE_SEPARATORS.test(value))) return 'Use one line, without tabs or control characters.';
  if (lines === 'multi' && CONTROL_BUT_LINES.test(value)) return 'Remove the control characters (line breaks and tabs may stay).';
  if (value.length > 0 && INVISIBLE.test(value)) return 'Use visible characters: this is only spaces or invisible characters.';
  return null;
}

/** The zod check of textFault, for a field of one line (the default) or of several. */
export const plainText = (lines: Lines = 'single') =>
  z.superRefine((value: string, context) => {
    const fault = textFault(value, lines);
    if (fault) context.addIssue({ code: 'custom', message: fault, input: value });
  });
