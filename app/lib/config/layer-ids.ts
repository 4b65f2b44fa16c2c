// Layer ids: what keeps a layer the same layer across reorders, inserts and edits (the model
// diff and merge key layers by them). Unique within a look, short and readable: "l-" and six
// base-36 characters. Two ways to make one: fresh (random) for a layer someone adds, and derived
// (from preset id, channel id and position) for a layer that arrives without one, so the same
// document always gets the same ids (upgrades of "hiltbench.config/1", header read-back).

export const LAYER_ID_PREFIX = "l-";
const SPAN = 36 ** 6;

const base36 = (n: number) => n.toString(36).padStart(6, "0");

/** FNV-1a over UTF-16 code units, 32 bits: short and deterministic, not a security measure. */
function fnv1a(s: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/**
 * The id a layer without one gets (the documented upgrade rule): "l-" + base36(FNV-1a-32 of
 * `presetId/channelId/index`, modulo 36^6), six digits. If a layer of the look already holds it,
 * the text gets "/2", "/3", … until the id is free.
 */
export function derivedLayerId(presetId: string, channelId: string, index: number, taken: ReadonlySet<string> = new Set()): string {
  const text = `${presetId}/${channelId}/${index}`;
  for (let n = 1; ; n++) {
    const id = LAYER_ID_PREFIX + base36(fnv1a(n === 1 ? text : `${text}/${n}`) % SPAN);
    if (!taken.has(id)) return id;
  }
}

/** A fresh random id for a new layer, not one of `taken`. */
export function freshLayerId(taken: ReadonlySet<string> = new Set()): string {
  const buf = new Uint32Array(2);
  for (;;) {
    globalThis.crypto.getRandomValues(buf);
    // 2^53 / 36^6 is large, so this is as good as uniform.
    const id = LAYER_ID_PREFIX + base36(((buf[0] % 0x200000) * 0x100000000 + buf[1]) % SPAN);
    if (!taken.has(id)) return id;
  }
}

const isObj = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/**
 * Gives every layer without an id a derived one, in a copy (unchanged parts shared; the input
 * is never changed). Reads defensively: anything not shaped like presets/looks/layers is left
 * for the validator to report. Layers that have an id keep it, and derived ids avoid them.
 */
export function fillLayerIds<T>(doc: T): T {
  if (!isObj(doc) || !Array.isArray(doc.presets)) return doc;
  let changed = false;
  const presets = doc.presets.map((p: unknown) => {
    if (!isObj(p) || !isObj(p.looks)) return p;
    const presetId = typeof p.id === "string" ? p.id : "";
    let lookChanged = false;
    // fromEntries defines own properties, so even a hostile "__proto__" key stays a key.
    const looks = Object.fromEntries(
      Object.entries(p.looks).map(([channelId, look]) => {
        if (!isObj(look) || !Array.isArray(look.layers)) return [channelId, look];
        const layers = look.layers as unknown[];
        if (!layers.some((l) => isObj(l) && !("id" in l))) return [channelId, look];
        const taken = new Set(layers.flatMap((l) => (isObj(l) && typeof l.id === "string" ? [l.id] : [])));
        const next = layers.map((l, i) => {
          if (!isObj(l) || "id" in l) return l;
          const id = derivedLayerId(presetId, channelId, i, taken);
          taken.add(id);
          // The id first, so the JSON form reads "id", "kind", …
          return { id, ...l };
        });
        lookChanged = true;
        return [channelId, { ...look, layers: next }];
      }),
    );
    if (!lookChanged) return p;
    changed = true;
    return { ...p, looks };
  });
  return changed ? ({ ...doc, presets } as T) : doc;
}
