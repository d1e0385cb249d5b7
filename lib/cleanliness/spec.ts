import { BASIS_UNIT, basisFactor, type Basis, type BasisKind } from "./basis";
import { CleanlinessInputError, CleanlinessSpecError } from "./errors";
import { formatCount } from "./format";
import {
  isCleanlinessLevel,
  LEVEL_NAMES,
  levelIndex,
  levelUpperBound,
  withinBound,
} from "./levels";
import {
  readCounts,
  SIZE_CLASS_KEYS,
  sizeClassIndex,
  type ParticleCounts,
  type SizeClassKey,
} from "./size-classes";

/** One limit of a specification, e.g. `B-E17` (joined), `EF12` (each on its own) or `I0`. */
export type SpecGroup = {
  readonly text: string;
  readonly classes: readonly SizeClassKey[];
  /** True for hyphen-joined classes, which share one limit on their sum. */
  readonly joined: boolean;
  /** The level written for A/V specifications; null for N. */
  readonly level: string | null;
  /** The largest normalised count allowed: the level's upper bound, or the N count. */
  readonly limit: number;
};

export type CleanlinessSpec = {
  readonly text: string;
  readonly prefix: "A" | "V" | "N";
  readonly basis: BasisKind;
  readonly groups: readonly SpecGroup[];
};

export type SpecRow = {
  classes: SizeClassKey[];
  /** Normalised count (summed over joined classes). */
  value: number;
  limit: number;
  level?: string;
  limitLevel?: string;
  pass: boolean;
  /** Built from the row's values when read (a getter on the row's prototype; JSON includes it). */
  readonly reason: string;
};

export type SpecEvaluation = { pass: boolean; rows: SpecRow[] };

const PREFIX_BASIS: Readonly<Record<string, BasisKind>> = {
  A: "area",
  V: "volume",
  N: "component",
};
const EXAMPLE = "e.g. A(B-E17/F-G14/H-I4/J-K2/L-N00) or N(C-E32000/H-I16/J-K0)";
const NUMBER = /^\d+(?:\.\d+)?$/;

/**
 * Reads a cleanliness specification in CCC notation [std, ISO 16232:2018 / VDA 19.1:2015]:
 * `A(…)` per 1000 cm², `V(…)` per 100 cm³, `N(…)` per component with counts. Hyphen-joined
 * classes (`B-E17`) share one limit on their sum; letters written together (`EF12`) are each
 * limited on their own. A class may appear once.
 */
export function parseCleanlinessSpec(code: string): CleanlinessSpec {
  if (typeof code !== "string")
    throw new CleanlinessSpecError("A specification must be text.", "spec");
  // Spaces are ignored, but a position is reported in the text as typed, so keep where each kept character was.
  const where: number[] = [];
  for (let i = 0; i < code.length; i++) if (!/\s/.test(code[i])) where.push(i);
  const text = code.replace(/\s+/g, "");
  const fail = (message: string, at: number): never => {
    const original = at < where.length ? where[at] : code.length;
    throw new CleanlinessSpecError(message, "spec", original + 1);
  };
  const outer = /^([A-Za-z])\((.*)\)$/.exec(text);
  if (!outer) {
    const at = !/^[A-Za-z]/.test(text)
      ? 0
      : text[1] !== "("
        ? 1
        : text.endsWith(")")
          ? text.indexOf(")") + 1
          : text.length;
    fail(
      `"${code}" is not in CCC notation: a letter A, V or N, then the limits in brackets (${EXAMPLE}).`,
      at,
    );
  }
  const [, prefix, body] = outer!;
  const basis = PREFIX_BASIS[prefix];
  if (basis === undefined) {
    fail(
      `"${prefix}" is not a specification prefix: use A (per 1000 cm²), V (per 100 cm³) or N (per component).`,
      0,
    );
  }
  if (body === "") fail("The specification lists no limits.", 2);

  const used = new Map<SizeClassKey, string>();
  let offset = 2;
  const groups = body.split("/").map((part) => {
    const start = offset;
    offset += part.length + 1;
    const group = parseGroup(part, prefix as "A" | "V" | "N", (message, at) =>
      fail(message, start + at),
    );
    for (const key of group.classes) {
      const earlier = used.get(key);
      if (earlier !== undefined) {
        fail(
          `Class ${key} is limited twice ("${earlier}" and "${part}"); each class may appear once.`,
          start,
        );
      }
      used.set(key, part);
    }
    return group;
  });
  return Object.freeze({
    text: `${prefix}(${groups.map((g) => g.text).join("/")})`,
    prefix: prefix as "A" | "V" | "N",
    basis: basis!,
    groups: Object.freeze(groups),
  });
}

/** `fail` throws with the position inside the group, counted from the group's first character. */
function parseGroup(
  part: string,
  prefix: "A" | "V" | "N",
  fail: (message: string, at: number) => never,
): SpecGroup {
  if (part === "") fail("Empty limit between two slashes.", 0);
  const match = /^([A-Za-z]+)(?:-([A-Za-z]+))?(.*)$/.exec(part);
  if (!match) {
    fail(
      `"${part}" must start with size-class letters (B…N), then the ${prefix === "N" ? "count" : "level"}.`,
      0,
    );
  }
  const [, first, second, valueText] = match!;
  const valueAt = part.length - valueText.length;
  const letters = first + (second ?? "");
  for (let i = 0; i < letters.length; i++) {
    const letter = letters[i];
    if (sizeClassIndex(letter) < 0) {
      fail(
        `"${letter}" in "${part}" is not a size class; use the capital letters B…N.`,
        i < first.length ? i : i + 1,
      );
    }
  }

  let classes: SizeClassKey[];
  const joined = second !== undefined;
  if (joined) {
    if (first.length !== 1 || second.length !== 1) {
      fail(
        `"${part}": a hyphen joins exactly two letters, the first and last class of the range.`,
        0,
      );
    }
    const from = sizeClassIndex(first);
    const to = sizeClassIndex(second);
    if (to <= from) {
      fail(
        `"${part}": a range runs from the smaller class to the larger (e.g. ${second}-${first} is reversed, ${first}-${first} is empty).`,
        0,
      );
    }
    classes = SIZE_CLASS_KEYS.slice(from, to + 1);
  } else {
    classes = [...first] as SizeClassKey[];
    for (let i = 1; i < classes.length; i++) {
      if (sizeClassIndex(classes[i]) <= sizeClassIndex(classes[i - 1])) {
        fail(`"${part}": write letters once each, from small to large (e.g. EF12).`, i);
      }
    }
  }

  if (prefix === "N") {
    if (!NUMBER.test(valueText)) {
      fail(
        `"${part}": an N() specification gives a count per component after the letters (got "${valueText}").`,
        valueAt,
      );
    }
    const limit = Number(valueText);
    return Object.freeze({ text: part, classes, joined, level: null, limit });
  }
  if (!isCleanlinessLevel(valueText)) {
    fail(`"${part}": "${valueText}" is not a cleanliness level; use 00, 0, 1 … 24.`, valueAt);
  }
  return Object.freeze({
    text: part,
    classes,
    joined,
    level: valueText,
    limit: levelUpperBound(valueText),
  });
}

// A specification compiled to what evaluation needs: one check per limit, classes as indices.
// Rows share the frozen `classes` arrays of their check rather than copying them per result.
// The fixed parts of each reason are built here once; evaluation only fills in the count.
type Check = {
  classes: SizeClassKey[];
  indices: number[];
  limit: number;
  limitLevel: string | null;
  /** "E: " */
  head: string;
  /**
   * What follows the count, ready-made: for A and V indexed by levelIndex × 2 + (fail ? 1 : 0),
   * e.g. " per 1000 cm² → level 7, limit 8 (≤ 250): pass"; for N [pass, fail].
   */
  tails: string[];
};

const compiled = new WeakMap<CleanlinessSpec, Check[]>();
const parsedText = new Map<string, CleanlinessSpec>();
const PARSED_TEXT_CACHE = 256;

function compile(spec: CleanlinessSpec): Check[] {
  let checks = compiled.get(spec);
  if (checks) return checks;
  const groups: readonly SpecGroup[] = spec?.groups;
  if (!spec || !Array.isArray(groups) || PREFIX_BASIS[spec.prefix] !== spec.basis) {
    throw new CleanlinessInputError("The specification is not a parsed CCC specification.", "spec");
  }
  checks = [];
  const unit = BASIS_UNIT[spec.basis];
  const push = (classes: SizeClassKey[], indices: number[], group: SpecGroup) => {
    const label = classes.length > 1 ? `${classes[0]}-${classes[classes.length - 1]}` : classes[0];
    const limitText =
      group.level === null
        ? `, limit ${formatCount(group.limit)}: `
        : `, limit ${group.level} (≤ ${group.limit}): `;
    const tails: string[] = [];
    if (group.level === null) {
      tails.push(` ${unit}${limitText}pass`, ` ${unit}${limitText}fail`);
    } else {
      for (const level of LEVEL_NAMES) {
        tails.push(
          ` ${unit} → level ${level}${limitText}pass`,
          ` ${unit} → level ${level}${limitText}fail`,
        );
      }
    }
    checks!.push({
      classes: Object.freeze(classes) as SizeClassKey[],
      indices,
      limit: group.limit,
      limitLevel: group.level,
      head: `${label}: `,
      tails,
    });
  };
  for (const group of groups as readonly SpecGroup[]) {
    const indices = group.classes.map((key) => {
      const index = sizeClassIndex(key);
      if (index < 0) throw new CleanlinessInputError(`"${key}" is not a size class.`, "spec");
      return index;
    });
    if (!(group.limit >= 0) || !Number.isFinite(group.limit)) {
      throw new CleanlinessInputError(`The limit of "${group.text}" is not a count.`, "spec");
    }
    if (group.level !== null && levelUpperBound(group.level) !== group.limit) {
      throw new CleanlinessInputError(
        `The limit of "${group.text}" does not match its level.`,
        "spec",
      );
    }
    if (group.joined) push([...group.classes], indices, group);
    else group.classes.forEach((key, i) => push([key], [indices[i]], group));
  }
  compiled.set(spec, checks);
  return checks;
}

function resolveSpec(spec: CleanlinessSpec | string): CleanlinessSpec {
  if (typeof spec !== "string") return spec;
  let parsed = parsedText.get(spec);
  if (!parsed) {
    parsed = parseCleanlinessSpec(spec);
    if (parsedText.size >= PARSED_TEXT_CACHE) parsedText.clear();
    parsedText.set(spec, parsed);
  }
  return parsed;
}

/**
 * Rows of an A or V check. Most evaluations are read for pass/fail alone, so the reason (text for
 * people) is built when read, from a getter on the prototype; toJSON writes it out like any field.
 */
class LevelRow implements SpecRow {
  readonly classes: SizeClassKey[];
  readonly limit: number;
  readonly level: string;
  readonly limitLevel: string;
  readonly #check: Check;
  readonly #levelAt: number;
  constructor(
    check: Check,
    readonly value: number,
    levelAt: number,
    readonly pass: boolean,
  ) {
    this.classes = check.classes;
    this.limit = check.limit;
    this.level = LEVEL_NAMES[levelAt];
    this.limitLevel = check.limitLevel!;
    this.#check = check;
    this.#levelAt = levelAt;
  }
  get reason() {
    return (
      this.#check.head +
      formatCount(this.value) +
      this.#check.tails[this.#levelAt * 2 + (this.pass ? 0 : 1)]
    );
  }
  toJSON() {
    return {
      classes: this.classes,
      value: this.value,
      limit: this.limit,
      level: this.level,
      limitLevel: this.limitLevel,
      pass: this.pass,
      reason: this.reason,
    };
  }
}

/** Rows of an N check (counts per component): no levels. */
class CountRow implements SpecRow {
  readonly classes: SizeClassKey[];
  readonly limit: number;
  readonly #check: Check;
  constructor(
    check: Check,
    readonly value: number,
    readonly pass: boolean,
  ) {
    this.classes = check.classes;
    this.limit = check.limit;
    this.#check = check;
  }
  get reason() {
    return this.#check.head + formatCount(this.value) + this.#check.tails[this.pass ? 0 : 1];
  }
  toJSON() {
    return {
      classes: this.classes,
      value: this.value,
      limit: this.limit,
      pass: this.pass,
      reason: this.reason,
    };
  }
}

const scratch = new Float64Array(SIZE_CLASS_KEYS.length);

/**
 * Compares counts with a specification. Area and volume results pass a limit when the normalised
 * count is at most the upper bound of the specified level (the same as its level being at most
 * the specified level); N results when the count per component is at most the number given.
 * Classes missing from the counts count as 0; classes missing from the specification are not
 * limited.
 */
export function evaluateAgainstSpec(
  counts: ParticleCounts,
  basis: Basis,
  spec: CleanlinessSpec | string,
): SpecEvaluation {
  const parsed = resolveSpec(spec);
  const checks = compile(parsed);
  const factor = basisFactor(basis);
  if (basis.kind !== parsed.basis) {
    throw new CleanlinessInputError(
      `The specification ${parsed.prefix}(…) is ${BASIS_UNIT[parsed.basis]}, but the result is ${BASIS_UNIT[basis.kind]}.`,
      "basis",
    );
  }
  readCounts(counts, scratch);
  const rows: SpecRow[] = new Array(checks.length);
  let pass = true;

  for (let c = 0; c < checks.length; c++) {
    const check = checks[c];
    let absolute = 0;
    for (let i = 0; i < check.indices.length; i++) absolute += scratch[check.indices[i]];
    const value = absolute * factor;
    const ok = withinBound(value, check.limit);
    if (!ok) pass = false;
    if (check.limitLevel !== null) {
      rows[c] = new LevelRow(check, value, levelIndex(value), ok);
    } else {
      rows[c] = new CountRow(check, value, ok);
    }
  }
  return { pass, rows };
}
