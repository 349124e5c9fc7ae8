/**
 * Scratch lists: plain arrays the engine refills for every plane (it is synchronous, so one list per use is
 * enough) and copies out at their exact length. An array grown by push from [] reserves room for about 17
 * entries at once, while a plane has a handful of corners or edges; a copy made with slice() holds exactly its
 * contents and keeps the list's element kind.
 *
 * A list is filled in place: entry i is stored when i is below the list's length, else pushed (so the list stays
 * packed). Each module writes those two steps at its own lists rather than calling one shared helper: a shared
 * helper's store would meet every kind of list the engine keeps (numbers, points, objects) and run polymorphic,
 * which measured as a sixth of planeGeometry's time.
 */


/** items[0 … n − 1] as a new array of exactly n items; those slots of `items` are then cleared. */
export function takeExact<T>(items: T[], n: number): T[] {
  const out = items.slice(0, n);
  // Overwritten rather than truncated: a shorter length could give the store back and grow it again.
  for (let k = 0; k < n; k++) (items as unknown[])[k] = undefined;
  return out;
}
