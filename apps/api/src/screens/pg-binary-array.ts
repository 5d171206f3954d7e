/**
 * One-dimensional PostgreSQL arrays in the binary wire format, for query parameters that carry a
 * whole chunk of results (`unnest($n::float8[])`). node-postgres sends a Buffer parameter in
 * binary, so PostgreSQL reads each double as 8 bytes instead of parsing its decimal text — the
 * larger part of the database's CPU time per stored result row (apps/api/src/screens/README.md).
 *
 * Layout (PostgreSQL's array_send/array_recv, src/backend/utils/adt/arrayfuncs.c, all integers
 * big-endian): int32 number of dimensions (1), int32 has-nulls flag, int32 element type OID,
 * then per dimension int32 length and int32 lower bound (1); then per element an int32 byte
 * length (−1 for NULL) followed by the element's binary form (float8: IEEE 754 big-endian;
 * int4: big-endian; text: UTF-8 bytes).
 */

/** Element type OIDs (pg_type.dat). */
const FLOAT8_OID = 701;
const INT4_OID = 23;
const TEXT_OID = 25;
const HEADER_BYTES = 20;

function writeHeader(buffer: Buffer, hasNulls: boolean, elementOid: number, length: number): void {
  buffer.writeInt32BE(1, 0);
  buffer.writeInt32BE(hasNulls ? 1 : 0, 4);
  buffer.writeInt32BE(elementOid, 8);
  buffer.writeInt32BE(length, 12);
  buffer.writeInt32BE(1, 16);
}

/** A float8[] parameter; NaN and ±Infinity become NULL (a value that could not be computed). */
export function float8ArrayParam(values: ArrayLike<number>): Buffer {
  const buffer = Buffer.allocUnsafe(HEADER_BYTES + values.length * 12);
  let offset = HEADER_BYTES;
  let hasNulls = false;
  for (let i = 0; i < values.length; i++) {
    const value = values[i]!;
    if (Number.isFinite(value)) {
      buffer.writeInt32BE(8, offset);
      buffer.writeDoubleBE(value, offset + 4);
      offset += 12;
    } else {
      buffer.writeInt32BE(-1, offset);
      offset += 4;
      hasNulls = true;
    }
  }
  writeHeader(buffer, hasNulls, FLOAT8_OID, values.length);
  return buffer.subarray(0, offset);
}

/** An int4[] parameter (every value must be an integer in the int32 range). */
export function int4ArrayParam(values: ArrayLike<number>): Buffer {
  const buffer = Buffer.allocUnsafe(HEADER_BYTES + values.length * 8);
  writeHeader(buffer, false, INT4_OID, values.length);
  let offset = HEADER_BYTES;
  for (let i = 0; i < values.length; i++) {
    buffer.writeInt32BE(4, offset);
    buffer.writeInt32BE(values[i]!, offset + 4); // throws a RangeError outside int32
    offset += 8;
  }
  return buffer;
}

/** A text[] parameter; null becomes NULL. */
export function textArrayParam(values: ArrayLike<string | null>): Buffer {
  let bytes = HEADER_BYTES;
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    bytes += 4 + (value === null || value === undefined ? 0 : Buffer.byteLength(value, 'utf8'));
  }
  const buffer = Buffer.allocUnsafe(bytes);
  let offset = HEADER_BYTES;
  let hasNulls = false;
  for (let i = 0; i < values.length; i++) {
    const value = values[i];
    if (value === null || value === undefined) {
      buffer.writeInt32BE(-1, offset);
      offset += 4;
      hasNulls = true;
    } else {
      const written = buffer.write(value, offset + 4, 'utf8');
      buffer.writeInt32BE(written, offset);
      offset += 4 + written;
    }
  }
  writeHeader(buffer, hasNulls, TEXT_OID, values.length);
  return buffer;
}
