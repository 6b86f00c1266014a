/**
 * How large an input can be, defined once: the whole input in bytes (files and standard input
 * alike), and the text that the text path builds as one string.
 */

/**
 * The largest input read, in bytes: 2 GiB - 1 (2^31 - 1), for files and standard input alike. The
 * byte engine keeps offsets into the bytes in Int32Array (engines/plainLines.ts), and Node reads at
 * most this many bytes into one buffer in one call. A larger input is refused with "input-too-large".
 */
export const maximumInputBytes = 2 ** 31 - 1;

/**
 * The longest JS string, in UTF-16 code units: 2^29 - 24 (V8's String::kMaxLength on 64-bit
 * platforms, which Node exposes as buffer.constants.MAX_STRING_LENGTH). A file that is not plain
 * ASCII (see engines/plainLines.ts) is decoded into one string, so its text must fit in this; a
 * longer one is refused with "text-too-large" before decoding.
 */
export const maximumTextLength = 2 ** 29 - 24;
