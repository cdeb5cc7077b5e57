/**
 * CRC-32 of the IEEE 802.3 polynomial (reflected 0xEDB88320, initial value and final XOR 0xFFFFFFFF),
 * the checksum of PNG chunks (PNG specification, 3rd ed., W3C 2025, §5.5 and annex D).
 * Table-driven, one byte at a time.
 *
 * @example
 * crc32(utf8Encode('123456789')) // 0xcbf43926 (the standard check value)
 */
const TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** Updates a running CRC (start with 0) with bytes[start, end); returns the CRC as an unsigned 32-bit integer. */
export function crc32(bytes: Uint8Array, start = 0, end = bytes.length, previous = 0): number {
  let c = (previous ^ 0xffffffff) >>> 0;
  for (let i = start; i < end; i++) c = TABLE[(c ^ bytes[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
