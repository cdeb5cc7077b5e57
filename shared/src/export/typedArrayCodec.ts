import { Base64Error, base64ToBytes, bytesToBase64 } from './base64.js';

/** Element types of the arrays a map file carries. */
export type ArrayDType = 'float64' | 'float32' | 'uint16' | 'uint8';
export type TypedArrayOf<D extends ArrayDType> = D extends 'float64'
  ? Float64Array
  : D extends 'float32'
    ? Float32Array
    : D extends 'uint16'
      ? Uint16Array
      : Uint8Array;

/** An array in a JSON file: its element type, its length and its bytes (little-endian) in base64. */
export interface EncodedArray {
  dtype: ArrayDType;
  length: number;
  base64: string;
}

const BYTES: Record<ArrayDType, number> = { float64: 8, float32: 4, uint16: 2, uint8: 1 };
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** The array's bytes in little-endian order (a view when the platform is little-endian, else a swapped copy). */
export function littleEndianBytes(a: Float64Array | Float32Array | Uint16Array | Uint8Array): Uint8Array {
  const bytes = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  if (LITTLE_ENDIAN || a.BYTES_PER_ELEMENT === 1) return bytes;
  const out = new Uint8Array(bytes.length);
  const w = a.BYTES_PER_ELEMENT;
  for (let i = 0; i < bytes.length; i += w) for (let k = 0; k < w; k++) out[i + k] = bytes[i + w - 1 - k];
  return out;
}

export function dtypeOf(a: Float64Array | Float32Array | Uint16Array | Uint8Array): ArrayDType {
  if (a instanceof Float64Array) return 'float64';
  if (a instanceof Float32Array) return 'float32';
  if (a instanceof Uint16Array) return 'uint16';
  return 'uint8';
}

/**
 * Base64 of a typed array in slices of `sliceBytes` (a multiple of 3, so the pieces concatenate to the
 * base64 of the whole), for writing large arrays without one giant string.
 */
export function* base64Slices(a: Float64Array | Float32Array | Uint16Array | Uint8Array, sliceBytes = 3 * 65536): Generator<string, void, undefined> {
  const bytes = littleEndianBytes(a);
  const step = sliceBytes - (sliceBytes % 3);
  for (let s = 0; s < bytes.length; s += step) yield bytesToBase64(bytes.subarray(s, Math.min(bytes.length, s + step)));
}

/** Thrown by `decodeArray` with a message naming the problem. */
export class ArrayDecodeError extends Error {
  override readonly name = 'ArrayDecodeError';
}

/**
 * Decodes an `EncodedArray` checking its element type, its declared length against the bytes, and
 * (when given) the expected type and length. Throws `ArrayDecodeError`.
 */
export function decodeArray<D extends ArrayDType>(value: unknown, expected: { dtype: D; length?: number }): TypedArrayOf<D> {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) throw new ArrayDecodeError('must be an object {dtype, length, base64}');
  const v = value as Record<string, unknown>;
  if (v.dtype !== expected.dtype) throw new ArrayDecodeError(`dtype must be "${expected.dtype}", got ${JSON.stringify(v.dtype)}`);
  if (typeof v.length !== 'number' || !Number.isInteger(v.length) || v.length < 0) throw new ArrayDecodeError('length must be a whole number');
  if (expected.length !== undefined && v.length !== expected.length) throw new ArrayDecodeError(`has ${v.length} elements, expected ${expected.length}`);
  if (typeof v.base64 !== 'string') throw new ArrayDecodeError('base64 must be text');
  let bytes: Uint8Array;
  try {
    bytes = base64ToBytes(v.base64);
  } catch (e) {
    if (e instanceof Base64Error) throw new ArrayDecodeError(e.message);
    throw e;
  }
  const w = BYTES[expected.dtype];
  if (bytes.length !== v.length * w) throw new ArrayDecodeError(`base64 holds ${bytes.length} bytes, expected ${v.length * w} for ${v.length} ${expected.dtype} values`);
  if (!LITTLE_ENDIAN && w > 1) {
    for (let i = 0; i < bytes.length; i += w) bytes.subarray(i, i + w).reverse();
  }
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  switch (expected.dtype) {
    case 'float64':
      return new Float64Array(buffer) as TypedArrayOf<D>;
    case 'float32':
      return new Float32Array(buffer) as TypedArrayOf<D>;
    case 'uint16':
      return new Uint16Array(buffer) as TypedArrayOf<D>;
    default:
      return new Uint8Array(buffer) as TypedArrayOf<D>;
  }
}
