/**
 * Control characters (NUL, escape, backspace...) never belong in names or notes people type;
 * tab and line breaks are fine in notes. PostgreSQL refuses NUL in text outright.
 */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

export const hasNoControlChars = (value: string): boolean => !CONTROL.test(value);
export const CONTROL_CHARS_MESSAGE = 'Remove the unusual characters (control characters).';
