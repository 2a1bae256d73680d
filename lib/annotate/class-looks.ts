/**
 * Which look (colour, dash and fill) each defect class wears. The look follows the class's
 * **key**, never its place in a part type's list, so Scratch looks the same on every part type
 * and everywhere it is shown: canvas, class picker, region list, measurement table.
 *
 * - The trade's usual classes (the keys the example part types use) have a look chosen by hand.
 *   On every example part type all classes differ in pattern (dash + fill), and where a part type
 *   has at most nine classes they also differ in colour and in dash (a Line region shows only its
 *   dash). Some meaning is kept where it costs nothing: an always-lit pixel is white, an
 *   always-dark pixel black, the critical crack vermillion, solid and cross-hatched.
 * - Any other key (a workspace's own class) takes a look from a hash of the key (32-bit FNV-1a),
 *   so it too looks the same wherever it appears. Only when that look is already worn on the same
 *   part type (by a usual class or by a custom class earlier in key order) does it step on to the
 *   next free look; custom classes never borrow a usual class's look.
 */
import { CLASS_COLOURS, CLASS_FILLS, CLASS_STROKES, styleOfLook, type ClassLook, type RegionStyle } from "./defect-styles";

// Colour indices into CLASS_COLOURS, stroke indices into CLASS_STROKES.
const [VERMILLION, SKY_BLUE, YELLOW, BLUISH_GREEN, REDDISH_PURPLE, ORANGE, BLUE, WHITE, BLACK] = [0, 1, 2, 3, 4, 5, 6, 7, 8];
const [SOLID, LONG_DASH, DOTTED, SHORT_DASH, DASH_DOT, DASH_DOT_DOT, LONG_SHORT, DOUBLE_DASH, SPARSE_DOTS] = [0, 1, 2, 3, 4, 5, 6, 7, 8];

/** Looks of the usual classes, by key (our own choice; checked against the example part types in the tests). */
export const USUAL_CLASS_LOOKS: Readonly<Record<string, ClassLook>> = {
  crack: { colour: VERMILLION, stroke: SOLID, fill: "cross-hatch" },
  scratch: { colour: SKY_BLUE, stroke: LONG_DASH, fill: "hatch-forward" },
  dent: { colour: YELLOW, stroke: SHORT_DASH, fill: "dots" },
  chip: { colour: BLUISH_GREEN, stroke: DASH_DOT, fill: "hatch-back" },
  dust: { colour: REDDISH_PURPLE, stroke: DOTTED, fill: "rows" },
  corrosion: { colour: ORANGE, stroke: DASH_DOT_DOT, fill: "hatch-back" },
  moisture: { colour: BLUE, stroke: LONG_SHORT, fill: "tint" },
  "torn-flex": { colour: WHITE, stroke: DOUBLE_DASH, fill: "hatch-forward" },
  stain: { colour: BLACK, stroke: SPARSE_DOTS, fill: "tint" },
  swelling: { colour: VERMILLION, stroke: DASH_DOT, fill: "rows" },
  "screw-boss": { colour: WHITE, stroke: LONG_SHORT, fill: "dots" },
  "pixel-lit": { colour: WHITE, stroke: DASH_DOT_DOT, fill: "dots" },
  "pixel-dark": { colour: BLACK, stroke: DASH_DOT_DOT, fill: "cross-hatch" },
  "pixel-subpixel": { colour: ORANGE, stroke: DASH_DOT_DOT, fill: "rows" },
};

const LOOK_COUNT = CLASS_COLOURS.length * CLASS_STROKES.length * CLASS_FILLS.length;

const lookId = (look: ClassLook) => `${look.colour}|${look.stroke}|${look.fill}`;
const USUAL_IDS = new Set(Object.values(USUAL_CLASS_LOOKS).map(lookId));

function lookAt(index: number): ClassLook {
  const fill = index % CLASS_FILLS.length;
  const rest = Math.floor(index / CLASS_FILLS.length);
  return { colour: rest % CLASS_COLOURS.length, stroke: Math.floor(rest / CLASS_COLOURS.length) % CLASS_STROKES.length, fill: CLASS_FILLS[fill] };
}

/** 32-bit FNV-1a over the key's UTF-16 code units (stable across browsers and Node). */
export function fnv1a(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash >>> 0;
}

/** The look a custom key starts from before any step past looks already worn. */
export function hashedLook(key: string): ClassLook {
  return lookAt(fnv1a(key) % LOOK_COUNT);
}

/** The look of every class of one part type, by key. */
export function classLooks(keys: readonly string[]): ReadonlyMap<string, ClassLook> {
  const looks = new Map<string, ClassLook>();
  const worn = new Set<string>();
  for (const key of keys) {
    const usual = USUAL_CLASS_LOOKS[key];
    if (usual && !looks.has(key)) {
      looks.set(key, usual);
      worn.add(lookId(usual));
    }
  }
  const custom = [...new Set(keys.filter((k) => !USUAL_CLASS_LOOKS[k]))].sort();
  for (const key of custom) {
    let index = fnv1a(key) % LOOK_COUNT;
    for (let step = 0; step < LOOK_COUNT; step++, index = (index + 1) % LOOK_COUNT) {
      const look = lookAt(index);
      const id = lookId(look);
      if (USUAL_IDS.has(id) || worn.has(id)) continue;
      looks.set(key, look);
      worn.add(id);
      break;
    }
  }
  return looks;
}

/** Styles for a part type's classes, by key. */
export function defectStyleMap(keys: readonly string[]): ReadonlyMap<string, RegionStyle> {
  return new Map([...classLooks(keys)].map(([key, look]) => [key, styleOfLook(look)]));
}
