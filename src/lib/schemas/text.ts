import { z } from 'zod';

/**
 * Control characters (NUL, escape, backspace...) never belong in names or notes people type;
 * tab and line breaks are fine in notes. PostgreSQL refuses NUL in text outright.
 */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f]/;

export const hasNoControlChars = (value: string): boolean => !CONTROL.test(value);
export const CONTROL_CHARS_MESSAGE = 'Remove the unusual characters (control characters).';

/** A NUL, or half of a surrogate pair: text no one can type, which PostgreSQL or JSON refuse. */
// eslint-disable-next-line no-control-regex
const UNWRITABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

export const hasOnlyWritableChars = (value: string): boolean => !UNWRITABLE.test(value);
export const UNWRITABLE_CHARS_MESSAGE =
	'Remove the unusual characters (a NUL or a broken character).';

/** Every text field of every schema: z.string that refuses NUL and lone surrogates. */
export const text = (params?: Parameters<typeof z.string>[0]) =>
	z.string(params).refine(hasOnlyWritableChars, UNWRITABLE_CHARS_MESSAGE);
