/**
 * Base64 (RFC 4648 §4, the standard alphabet with `=` padding) of raw bytes,
 * table driven, for both hosts. The page carries each coil's float32 samples
 * this way; a five-coil page holds several megabytes of it, so the codec
 * works on typed arrays: no per-character string building, no argument
 * spreading, no `btoa`/`atob` round trip through a binary string.
 */

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
/** RFC 4648 §4: the pad character. */
const PAD = '='.charCodeAt(0);
/** RFC 4648 §4: 3 bytes → 4 characters of 6 bits each. */
const BYTES_PER_GROUP = 3;
const CHARS_PER_GROUP = 4;
const SIX_BITS = 0x3f;
/** Marks a character outside the alphabet in the decoding table. */
const NOT_IN_ALPHABET = 0xff;

const ENCODE = Uint8Array.from(ALPHABET, (char) => char.charCodeAt(0));
const DECODE = (() => {
  const table = new Uint8Array(256).fill(NOT_IN_ALPHABET);
  ENCODE.forEach((code, value) => { table[code] = value; });
  return table;
})();

/**
 * Bytes → text, one character a byte: the WHATWG Encoding Standard maps the
 * label "latin1" to windows-1252, which is ASCII on bytes 0x00–0x7F, the
 * only bytes base64 writes. Both hosts decode natively (five times the
 * speed of String.fromCharCode over chunks: 2 MB in 4–5 ms against 24–32
 * on the 2-core machine).
 */
const ASCII_DECODER = new TextDecoder('latin1');

/** ASCII codes → string. */
function asciiToString(codes: Uint8Array): string {
  return ASCII_DECODER.decode(codes);
}

/** Bytes → base64 text. */
export function encodeBase64(bytes: Uint8Array): string {
  const groups = Math.ceil(bytes.length / BYTES_PER_GROUP);
  const out = new Uint8Array(groups * CHARS_PER_GROUP);
  const whole = bytes.length - (bytes.length % BYTES_PER_GROUP);
  let o = 0;
  for (let i = 0; i < whole; i += BYTES_PER_GROUP) {
    const word = ((bytes[i] as number) << 16) | ((bytes[i + 1] as number) << 8) | (bytes[i + 2] as number);
    out[o] = ENCODE[word >>> 18] as number;
    out[o + 1] = ENCODE[(word >>> 12) & SIX_BITS] as number;
    out[o + 2] = ENCODE[(word >>> 6) & SIX_BITS] as number;
    out[o + 3] = ENCODE[word & SIX_BITS] as number;
    o += CHARS_PER_GROUP;
  }
  const rest = bytes.length - whole;
  if (rest > 0) {
    const word = ((bytes[whole] as number) << 16) | (rest === 2 ? (bytes[whole + 1] as number) << 8 : 0);
    out[o] = ENCODE[word >>> 18] as number;
    out[o + 1] = ENCODE[(word >>> 12) & SIX_BITS] as number;
    out[o + 2] = rest === 2 ? (ENCODE[(word >>> 6) & SIX_BITS] as number) : PAD;
    out[o + 3] = PAD;
  }
  return asciiToString(out);
}

/** Base64 text → bytes; throws on a character outside the alphabet or a length that is not a whole number of groups. */
export function decodeBase64(text: string): Uint8Array {
  if (text.length % CHARS_PER_GROUP !== 0) throw new Error(`base64: length ${text.length} is not a multiple of ${CHARS_PER_GROUP}`);
  let padding = 0;
  while (padding < 2 && text.length - padding > 0 && text.charCodeAt(text.length - 1 - padding) === PAD) padding += 1;
  const out = new Uint8Array((text.length / CHARS_PER_GROUP) * BYTES_PER_GROUP - padding);
  let o = 0;
  for (let i = 0; i < text.length; i += CHARS_PER_GROUP) {
    const a = DECODE[text.charCodeAt(i)] ?? NOT_IN_ALPHABET;
    const b = DECODE[text.charCodeAt(i + 1)] ?? NOT_IN_ALPHABET;
    const last = i + CHARS_PER_GROUP === text.length;
    const c = last && padding === 2 ? 0 : (DECODE[text.charCodeAt(i + 2)] ?? NOT_IN_ALPHABET);
    const d = last && padding >= 1 ? 0 : (DECODE[text.charCodeAt(i + 3)] ?? NOT_IN_ALPHABET);
    if ((a | b | c | d) === NOT_IN_ALPHABET || a > SIX_BITS || b > SIX_BITS || c > SIX_BITS || d > SIX_BITS) {
      throw new Error(`base64: a character outside the alphabet near position ${i}`);
    }
    const word = (a << 18) | (b << 12) | (c << 6) | d;
    if (o < out.length) out[o++] = word >>> 16;
    if (o < out.length) out[o++] = (word >>> 8) & 0xff;
    if (o < out.length) out[o++] = word & 0xff;
  }
  return out;
}
