// Base64 decoding (RFC 4648 §4 alphabet) for the inlined WebAssembly module; src/ has no atob or Buffer.

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';

/** Decodes RFC 4648 base64 text (padding optional, no whitespace) into bytes; throws RangeError on a bad character. */
export function decodeBase64(text: string): Uint8Array {
  const lookup = new Int16Array(128).fill(-1);
  for (let i = 0; i < ALPHABET.length; i++) lookup[ALPHABET.charCodeAt(i)] = i;
  let end = text.length;
  while (end > 0 && text.charCodeAt(end - 1) === 61) end--; // '='
  const out = new Uint8Array(Math.floor((end * 3) / 4));
  let acc = 0;
  let bits = 0;
  let o = 0;
  for (let i = 0; i < end; i++) {
    const code = text.charCodeAt(i);
    const v = code < 128 ? lookup[code] : -1;
    if (v < 0) throw new RangeError(`invalid base64 character at ${i}`);
    acc = ((acc << 6) | v) & 0xffffff;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[o++] = (acc >> bits) & 0xff;
    }
  }
  return out;
}
