/**
 * Remembered results keyed by the arrays they were computed from. The engine
 * never writes to the arrays it is given (nor do the faces), so a result
 * computed for an array stays right for as long as the array lives; the
 * WeakMaps let both go together.
 */

/** make(), remembered under the pair of objects (owner, key). */
export function rememberedFor<V>(cache: WeakMap<object, WeakMap<object, V>>, owner: object, key: object, make: () => V): V {
  let byKey = cache.get(owner);
  if (!byKey) {
    byKey = new WeakMap();
    cache.set(owner, byKey);
  }
  let v = byKey.get(key);
  if (v === undefined) {
    v = make();
    byKey.set(key, v);
  }
  return v;
}

/** make(), remembered under an object and a plain key (a cutoff, an option string). */
export function rememberedAt<K, V>(cache: WeakMap<object, Map<K, V>>, owner: object, key: K, make: () => V): V {
  let byKey = cache.get(owner);
  if (!byKey) {
    byKey = new Map();
    cache.set(owner, byKey);
  }
  let v = byKey.get(key);
  if (v === undefined) {
    v = make();
    byKey.set(key, v);
  }
  return v;
}
