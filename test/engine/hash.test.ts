import { canonicalBytes, contentHash, fnv1a64, jobKey, UnhashableInput } from "../../src/engine/hash";

const bytesOf = (s: string): Uint8Array => new TextEncoder().encode(s);

// FNV-1a 64 with BigInt, straight from the definition (Fowler–Noll–Vo: h = (h XOR byte) × prime
// mod 2^64), as an independent check of the four-limb arithmetic.
function fnvReference(bytes: Uint8Array): string {
  let h = 0xcbf29ce484222325n;
  for (const b of bytes) h = ((h ^ BigInt(b)) * 0x100000001b3n) & 0xffffffffffffffffn;
  return h.toString(16).padStart(16, "0");
}

describe("FNV-1a 64", () => {
  test("published test vectors (FNV reference test suite; values from memory, confirmed by the BigInt definition below)", () => {
    expect(fnv1a64(bytesOf(""))).toBe("cbf29ce484222325");
    expect(fnv1a64(bytesOf("a"))).toBe("af63dc4c8601ec8c");
    expect(fnv1a64(bytesOf("foobar"))).toBe("85944171f73967e8");
  });

  test("equals the BigInt definition on every byte value and on long random inputs", () => {
    const all = Uint8Array.from({ length: 256 }, (_, i) => i);
    expect(fnv1a64(all)).toBe(fnvReference(all));
    let seed = 12345;
    for (let trial = 0; trial < 20; trial++) {
      const b = new Uint8Array(1 + trial * 97);
      for (let i = 0; i < b.length; i++) {
        seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
        b[i] = seed >>> 24;
      }
      expect(fnv1a64(b)).toBe(fnvReference(b));
    }
  });

  test("the canonical stream goes through the same arithmetic", () => {
    const v = { a: [1, "x", null], b: new Float64Array([1.5, -2]) };
    expect(contentHash(v)).toBe(fnvReference(canonicalBytes(v)));
  });
});

describe("canonical serialisation", () => {
  test("object key order does not matter, at any depth", () => {
    expect(contentHash({ a: 1, b: { c: 2, d: [3] } })).toBe(contentHash({ b: { d: [3], c: 2 }, a: 1 }));
  });

  test("a typed array differs from the plain array of the same numbers, and typed arrays differ by type", () => {
    const xs = [1, 2, 3];
    const h = new Set([
      contentHash(xs),
      contentHash(Float64Array.from(xs)),
      contentHash(Float32Array.from(xs)),
      contentHash(Int32Array.from(xs)),
    ]);
    expect(h.size).toBe(4);
    expect(contentHash(Float64Array.from(xs))).toBe(contentHash(new Float64Array([1, 2, 3])));
  });

  test("a typed array is hashed by its elements, not by the buffer it views", () => {
    const big = new Float64Array([9, 1, 2, 3, 9]);
    expect(contentHash(big.subarray(1, 4))).toBe(contentHash(new Float64Array([1, 2, 3])));
  });

  test("NaN, null, undefined, ±Infinity, 0 and −0 are all different; every NaN is the same", () => {
    const values = [NaN, null, undefined, Infinity, -Infinity, 0, -0, "NaN", false];
    expect(new Set(values.map((v) => contentHash([v]))).size).toBe(values.length);
    // A NaN with another payload (0x7ff8…01) hashes as the ordinary NaN, in arrays and typed arrays.
    const odd = new Float64Array(new BigUint64Array([0x7ff8000000000001n]).buffer)[0];
    expect(Number.isNaN(odd)).toBe(true);
    expect(contentHash(new Float64Array([1, odd]))).toBe(contentHash(new Float64Array([1, NaN])));
    expect(contentHash([odd])).toBe(contentHash([NaN]));
    expect(contentHash(new Float64Array([NaN]))).not.toBe(contentHash(new Float64Array([Infinity])));
  });

  test("Dates are their time: equal instants hash alike, a millisecond apart differ, and a Date is not its number", () => {
    const t = Date.UTC(2026, 10, 27);
    expect(contentHash(new Date(t))).toBe(contentHash(new Date("2026-11-27T00:00:00Z")));
    expect(contentHash(new Date(t))).not.toBe(contentHash(new Date(t + 1)));
    expect(contentHash(new Date(t))).not.toBe(contentHash(t));
    expect(contentHash(new Date(NaN))).toBe(contentHash(new Date("not a date")));
  });

  test("strings, numbers and booleans do not collide across types; array boundaries count", () => {
    expect(contentHash("1")).not.toBe(contentHash(1));
    expect(contentHash(true)).not.toBe(contentHash(1));
    expect(contentHash(["ab", "c"])).not.toBe(contentHash(["a", "bc"]));
    expect(contentHash([[1], 2])).not.toBe(contentHash([1, [2]]));
    expect(contentHash({ a: undefined })).not.toBe(contentHash({}));
  });

  test("Maps and Sets ignore insertion order", () => {
    expect(contentHash(new Map([["a", 1], ["b", 2]]))).toBe(contentHash(new Map([["b", 2], ["a", 1]])));
    expect(contentHash(new Set([1, 2]))).toBe(contentHash(new Set([2, 1])));
    expect(contentHash(new Set([1, 2]))).not.toBe(contentHash([1, 2]));
  });

  test("a single changed element changes the hash", () => {
    const y = new Float64Array(470).map((_, i) => 1500 + i);
    const z = y.slice();
    z[233] += 1e-9;
    expect(contentHash(y)).not.toBe(contentHash(z));
  });

  test("the job key covers the kind", () => {
    expect(jobKey("analyse", { a: 1 })).not.toBe(jobKey("backtest-run", { a: 1 }));
  });

  test("cycles, functions and class instances are refused with UnhashableInput", () => {
    const cyc: Record<string, unknown> = {};
    cyc.self = cyc;
    expect(() => contentHash(cyc)).toThrow(UnhashableInput);
    expect(() => contentHash({ f: () => 1 })).toThrow(UnhashableInput);
    class Thing {
      x = 1;
    }
    expect(() => contentHash(new Thing())).toThrow(UnhashableInput);
    // Shared (not cyclic) references are fine.
    const shared = [1, 2];
    expect(() => contentHash({ a: shared, b: shared })).not.toThrow();
  });
});
