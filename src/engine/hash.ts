/**
 * Content hashes of job inputs, for the result cache. Two steps:
 *
 * 1. A canonical serialisation, written into one byte buffer (no strings or JSON built):
 *    every value starts with a type tag; object keys are sorted (UTF-16 order), so key order
 *    does not matter; typed arrays are their element type plus their elements' bytes, so
 *    Float64Array [1, 2] and the array [1, 2] differ; Dates are their time in ms; numbers are
 *    their IEEE-754 bytes (NaN canonical, so every NaN is equal to every other NaN, and NaN,
 *    null, undefined, ±Infinity, 0 and −0 are all different). Maps and Sets are hashed by
 *    their sorted entry hashes, so insertion order does not matter. Cycles, functions,
 *    symbols and class instances other than the built-ins above are refused
 *    (`UnhashableInput`): such inputs are run without the cache.
 * 2. FNV-1a over those bytes with the 64-bit parameters (Fowler–Noll–Vo; offset basis
 *    0xcbf29ce484222325, prime 0x100000001b3 = 2^40 + 2^8 + 0xb3), in four 16-bit limbs so
 *    that it runs on plain doubles without BigInt and without Node's crypto (the pane needs
 *    it too). Non-cryptographic: the cache trusts its inputs; with a few hundred entries the
 *    chance of any 64-bit collision is below 1e-14.
 *
 * Byte order is the host's (little-endian on every platform Office and Node run on); a hash
 * is only ever compared with hashes made in the same process.
 */

export class UnhashableInput extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UnhashableInput";
  }
}

/** FNV-1a, 64-bit, as four 16-bit limbs (h0 lowest), over a whole byte array. */
export function fnv1a64(b: Uint8Array, length: number = b.length): string {
  let h0 = 0x2325;
  let h1 = 0x8422;
  let h2 = 0x9ce4;
  let h3 = 0xcbf2;
  for (let i = 0; i < length; i++) {
    h0 ^= b[i];
    // h × (2^40 + 0x1b3) mod 2^64: 0x1b3 on every limb, plus h0, h1 shifted 8 bits into limbs 2, 3.
    const t0 = h0 * 0x1b3;
    const t1 = h1 * 0x1b3 + (t0 >>> 16);
    const t2 = h2 * 0x1b3 + (h0 << 8) + (t1 >>> 16);
    h3 = (h3 * 0x1b3 + (h1 << 8) + (t2 >>> 16)) & 0xffff;
    h0 = t0 & 0xffff;
    h1 = t1 & 0xffff;
    h2 = t2 & 0xffff;
  }
  const p = (x: number): string => x.toString(16).padStart(4, "0");
  return p(h3) + p(h2) + p(h1) + p(h0);
}

/**
 * The canonical byte stream, written into one growing buffer and hashed in one pass
 * afterwards (a call per byte through an interface cost ~10× more on a 470-week input).
 */
class Writer {
  buf: Uint8Array;
  len = 0;
  private readonly f64 = new Float64Array(1);
  private readonly f64Bytes = new Uint8Array(this.f64.buffer);
  private readonly u32 = new Uint32Array(1);
  private readonly u32Bytes = new Uint8Array(this.u32.buffer);

  constructor(initialBytes = 16384) {
    this.buf = new Uint8Array(initialBytes);
  }

  private room(n: number): void {
    if (this.len + n <= this.buf.length) return;
    let size = this.buf.length * 2;
    while (size < this.len + n) size *= 2;
    const next = new Uint8Array(size);
    next.set(this.buf.subarray(0, this.len));
    this.buf = next;
  }

  byte(b: number): void {
    this.room(1);
    this.buf[this.len++] = b;
  }

  raw(b: Uint8Array): void {
    this.room(b.length);
    this.buf.set(b, this.len);
    this.len += b.length;
  }

  uint32(n: number): void {
    this.u32[0] = n >>> 0;
    this.raw(this.u32Bytes);
  }

  /** A number: NaN as one tag (every NaN alike), anything else its IEEE-754 bytes after a tag. */
  number(x: number): void {
    if (x !== x) {
      this.byte(Tag.NaN);
      return;
    }
    this.room(9);
    this.buf[this.len++] = Tag.Number;
    this.f64[0] = x;
    this.buf.set(this.f64Bytes, this.len);
    this.len += 8;
  }

  /** Length, then UTF-16 code units, low byte first. */
  text(s: string): void {
    this.uint32(s.length);
    this.room(2 * s.length);
    const buf = this.buf;
    let at = this.len;
    for (let i = 0; i < s.length; i++) {
      const c = s.charCodeAt(i);
      buf[at++] = c & 0xff;
      buf[at++] = c >>> 8;
    }
    this.len = at;
  }

  bytes(): Uint8Array {
    return this.buf.slice(0, this.len);
  }

  hash(): string {
    return fnv1a64(this.buf, this.len);
  }
}

const enum Tag {
  Undefined = 1,
  Null,
  False,
  True,
  Number,
  NaN,
  BigInt,
  String,
  Date,
  Array,
  Object,
  TypedArray,
  DataView,
  ArrayBuffer,
  Map,
  Set,
}

type AnyTypedArray =
  | Int8Array
  | Uint8Array
  | Uint8ClampedArray
  | Int16Array
  | Uint16Array
  | Int32Array
  | Uint32Array
  | Float32Array
  | Float64Array
  | BigInt64Array
  | BigUint64Array;

function writeTypedArray(w: Writer, a: AnyTypedArray, type: string): void {
  w.byte(Tag.TypedArray);
  w.text(type);
  w.uint32(a.length);
  if (type === "[object Float64Array]" || type === "[object Float32Array]") {
    // Raw bytes unless a NaN is present: NaNs with different payloads must hash alike.
    const f = a as Float64Array | Float32Array;
    let nan = false;
    for (let i = 0; i < f.length; i++) {
      if (f[i] !== f[i]) {
        nan = true;
        break;
      }
    }
    if (nan) {
      for (let i = 0; i < f.length; i++) w.number(f[i]);
      return;
    }
  }
  w.raw(new Uint8Array(a.buffer, a.byteOffset, a.byteLength));
}

// Type tests by tag, not instanceof: a structured clone can come from another realm (a vm
// context, as under jest), whose Date and Object.prototype are not this realm's.
function tagOf(v: object): string {
  return Object.prototype.toString.call(v);
}

function isPlainObject(v: object): boolean {
  const proto = Object.getPrototypeOf(v);
  return proto === null || (Object.getPrototypeOf(proto) === null && tagOf(v) === "[object Object]");
}

function entryHash(parts: unknown[], ancestors: Set<object>): string {
  const w = new Writer(256);
  for (const p of parts) write(w, p, ancestors);
  return w.hash();
}

function write(w: Writer, v: unknown, ancestors: Set<object>): void {
  switch (typeof v) {
    case "undefined":
      w.byte(Tag.Undefined);
      return;
    case "boolean":
      w.byte(v ? Tag.True : Tag.False);
      return;
    case "number":
      w.number(v);
      return;
    case "bigint":
      w.byte(Tag.BigInt);
      w.text(v.toString());
      return;
    case "string":
      w.byte(Tag.String);
      w.text(v);
      return;
    case "function":
    case "symbol":
      throw new UnhashableInput(`a ${typeof v} cannot be part of a job input`);
  }
  if (v === null) {
    w.byte(Tag.Null);
    return;
  }
  const o = v as object;
  const tag = tagOf(o);
  if (ArrayBuffer.isView(o)) {
    if (tag === "[object DataView]") {
      const view = o as DataView;
      w.byte(Tag.DataView);
      w.uint32(view.byteLength);
      w.raw(new Uint8Array(view.buffer, view.byteOffset, view.byteLength));
    } else {
      writeTypedArray(w, o as AnyTypedArray, tag);
    }
    return;
  }
  if (tag === "[object Date]") {
    w.byte(Tag.Date);
    w.number(Date.prototype.getTime.call(o));
    return;
  }
  if (tag === "[object ArrayBuffer]") {
    const buffer = o as ArrayBuffer;
    w.byte(Tag.ArrayBuffer);
    w.uint32(buffer.byteLength);
    w.raw(new Uint8Array(buffer));
    return;
  }
  if (ancestors.has(o)) throw new UnhashableInput("a job input refers back to itself");
  ancestors.add(o);
  try {
    if (Array.isArray(o)) {
      w.byte(Tag.Array);
      w.uint32(o.length);
      for (let i = 0; i < o.length; i++) write(w, o[i], ancestors);
    } else if (tag === "[object Map]") {
      const hashes: string[] = [];
      for (const [k, val] of o as Map<unknown, unknown>) hashes.push(entryHash([k, val], ancestors));
      hashes.sort();
      w.byte(Tag.Map);
      w.uint32(hashes.length);
      for (const h of hashes) w.text(h);
    } else if (tag === "[object Set]") {
      const hashes: string[] = [];
      for (const val of o as Set<unknown>) hashes.push(entryHash([val], ancestors));
      hashes.sort();
      w.byte(Tag.Set);
      w.uint32(hashes.length);
      for (const h of hashes) w.text(h);
    } else if (isPlainObject(o)) {
      const rec = o as Record<string, unknown>;
      const keys = Object.keys(rec).sort();
      w.byte(Tag.Object);
      w.uint32(keys.length);
      for (const k of keys) {
        w.text(k);
        write(w, rec[k], ancestors);
      }
    } else {
      const name = (o as { constructor?: { name?: string } }).constructor?.name ?? "unknown";
      throw new UnhashableInput(`a ${name} object cannot be hashed as a job input`);
    }
  } finally {
    ancestors.delete(o);
  }
}

/** The canonical bytes of `value` (for tests, and for looking at what is hashed). */
export function canonicalBytes(value: unknown): Uint8Array {
  const w = new Writer();
  write(w, value, new Set());
  return w.bytes();
}

/** 64-bit FNV-1a of the canonical serialisation, as 16 hex digits. Throws UnhashableInput. */
export function contentHash(value: unknown): string {
  const w = new Writer();
  write(w, value, new Set());
  return w.hash();
}

/** The cache key of a job: its kind and input together. */
export function jobKey(kind: string, input: unknown): string {
  const w = new Writer();
  write(w, kind, new Set());
  write(w, input, new Set());
  return w.hash();
}
