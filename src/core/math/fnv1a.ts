/** 32-bit FNV-1a (Fowler, Noll, Vo) over the UTF-16 code units of `text` (bytes, for ASCII). */
export function fnv1a(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h;
}
