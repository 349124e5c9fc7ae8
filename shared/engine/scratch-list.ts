/**
 * Scratch lists: plain arrays the engine refills for every plane (it is synchronous, so one list per use is
 * enough) and copies out at their exact length. An array grown by push from [] reserves room for about 17
 * entries at once, while a plane has a handful of corners or edges; a copy made with slice() holds exactly its
 * contents and keeps the list's element kind.
 */

/** Put `v` at `i` of a scratch list (i ≤ its length, so the list stays packed). */
export function put<T>(list: T[], i: number, v: T): void {
  if (i < list.length) list[i] = v;
  else list.push(v);
}

/** items[0 … n − 1] as a new array of exactly n items; those slots of `items` are then cleared. */
export function takeExact<T>(items: T[], n: number): T[] {
  const out = items.slice(0, n);
  // Overwritten rather than truncated: a shorter length could give the store back and grow it again.
  for (let k = 0; k < n; k++) (items as unknown[])[k] = undefined;
  return out;
}
