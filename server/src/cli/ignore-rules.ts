/**
 * The rules of a `.pneuignore` matched a path segment at a time, with what each folder leaves of
 * them kept per folder. The `ignore` package turns each pattern into one regular expression over
 * the whole path; a `**` becomes `(?:\/[^\/]+)*`, and with two of them, or one beside a segment
 * with several `*`, the expression tries every way of sharing the folders out between them: a
 * note 200 folders down took about 30 ms per rule (`**` + `/*-*-*-*` + `/**` + `/*.pneu`), and every note of
 * the folder paid it again. Here a rule is a list of segments, and the folders of a path are
 * read once: the state of each rule after a folder (the set of its segments it may have reached)
 * is kept for that folder, and a note costs one more step from its folder's state.
 *
 * Only files whose every line is plain take this route (`plainRules`): patterns of letters,
 * digits, `.`, `_`, `-`, `*` and `?`, with `**` only as a whole segment, an optional `!` first,
 * a `/` first or last. Anything else (classes `[...]`, escapes, spaces, `***`) leaves the file to
 * the `ignore` package, which reads every form git knows. The answers are the package's own
 * (tests/cli/ignore-rules.test.ts compares them on generated rules and paths): as there, letters
 * match in any case, and `test` of a path says what the rules say of the path itself; the folders
 * above it are the caller's (`IgnoreFiles` in inputs.ts works each folder out before its notes).
 */

/** What the rules say of one path: left out, taken back by a `!` rule, or neither. */
export interface RuleVerdict {
  readonly ignored: boolean;
  readonly unignored: boolean;
}

/** What `IgnoreFiles` asks of a file's rules (the `ignore` package's `Ignore` answers it too). */
export interface PathRules {
  test(path: string): RuleVerdict;
}

interface Rule {
  readonly negative: boolean;
  readonly dirOnly: boolean;
  /** A segment's pattern (letters lower-cased), or null for `**`. */
  readonly segments: readonly (string | null)[];
}

/** Rules with more segments than a state's bits are not taken (such a file goes to the package). */
const MAX_SEGMENTS = 30;
const PLAIN_LINE = /^!?\/?[A-Za-z0-9._*?-]+(?:\/[A-Za-z0-9._*?-]+)*\/?$/;

const NEITHER: RuleVerdict = Object.freeze({ ignored: false, unignored: false });
const IGNORED: RuleVerdict = Object.freeze({ ignored: true, unignored: false });
const UNIGNORED: RuleVerdict = Object.freeze({ ignored: false, unignored: true });

/** The rules of a file's lines, or null when a line is not plain (see the module comment). */
export function plainRules(lines: readonly string[]): PlainRules | null {
  const rules: Rule[] = [];
  for (const raw of lines) {
    // Trailing spaces are dropped (by hand: a pattern for them backtracks on a run of spaces).
    let end = raw.length;
    while (end > 0 && raw.charCodeAt(end - 1) === 0x20) end--;
    const line = raw.slice(0, end);
    if (line === '' || line.startsWith('#')) continue;
    if (!PLAIN_LINE.test(line)) return null;
    let body = line;
    const negative = body.startsWith('!');
    if (negative) body = body.slice(1);
    const dirOnly = body.endsWith('/');
    if (dirOnly) body = body.slice(0, -1);
    const rooted = body.startsWith('/');
    if (rooted) body = body.slice(1);
    const parts = body.split('/');
    // A pattern with no slash but at its end matches at any depth.
    if (!rooted && parts.length === 1) parts.unshift('**');
    const segments: (string | null)[] = [];
    for (const part of parts) {
      if (part === '**') { segments.push(null); continue; }
      if (part.includes('**') || part === '.' || part === '..') return null;
      segments.push(part.toLowerCase());
    }
    if (segments.length > MAX_SEGMENTS) return null;
    rules.push({ negative, dirOnly, segments });
  }
  return new PlainRules(rules);
}

export class PlainRules implements PathRules {
  /** Per folder (`a/b/`, and '' for the top), the state of each rule after its segments. */
  private readonly folders = new Map<string, Int32Array>();
  private readonly start: Int32Array;

  constructor(private readonly rules: readonly Rule[]) {
    this.start = new Int32Array(rules.length);
    for (let r = 0; r < rules.length; r++) this.start[r] = closure(rules[r]!, 1);
    this.folders.set('', this.start);
  }

  /** What the rules say of `path` (a folder's with a slash after it), relative to the file's folder. */
  test(path: string): RuleVerdict {
    const isDir = path.endsWith('/');
    const cut = isDir ? path.lastIndexOf('/', path.length - 2) : path.lastIndexOf('/');
    const folder = path.slice(0, cut + 1);
    const name = path.slice(cut + 1, isDir ? -1 : undefined);
    const before = this.stateOf(folder);
    let verdict = NEITHER;
    for (let r = 0; r < this.rules.length; r++) {
      const rule = this.rules[r]!;
      if (rule.dirOnly && !isDir) continue;
      const after = step(rule, before[r]!, name);
      if ((after & (1 << rule.segments.length)) !== 0) verdict = rule.negative ? UNIGNORED : IGNORED;
    }
    return verdict;
  }

  /** The rules' states after the segments of `folder` (`a/b/`), worked out once per folder. */
  private stateOf(folder: string): Int32Array {
    const known = this.folders.get(folder);
    if (known) return known;
    const cut = folder.lastIndexOf('/', folder.length - 2);
    const parent = this.stateOf(folder.slice(0, cut + 1));
    const name = folder.slice(cut + 1, -1);
    const state = new Int32Array(this.rules.length);
    for (let r = 0; r < this.rules.length; r++) state[r] = step(this.rules[r]!, parent[r]!, name);
    this.folders.set(folder, state);
    return state;
  }
}

/**
 * The state after one more segment: bit j set when the rule's first j segments can match the
 * path so far. A `**` matches any number of segments, at least one when it ends the rule (`a/**`
 * is what lies inside `a`, not `a`).
 */
function step(rule: Rule, state: number, name: string): number {
  const segments = rule.segments;
  const last = segments.length;
  let next = 0;
  for (let j = 0; j < last; j++) {
    if ((state & (1 << j)) === 0) continue;
    const pattern = segments[j]!;
    if (pattern === null) {
      next |= 1 << j;
      if (j === last - 1) next |= 1 << last;
    } else if (segmentMatches(pattern, name)) {
      next |= 1 << (j + 1);
    }
  }
  return closure(rule, next);
}

/** The state with every `**` but a last one also passed over (matching no segment). */
function closure(rule: Rule, state: number): number {
  const segments = rule.segments;
  for (let j = 0; j < segments.length - 1; j++) {
    if ((state & (1 << j)) !== 0 && segments[j] === null) state |= 1 << (j + 1);
  }
  return state;
}

/** An ASCII capital as its small letter; any other code unit as it is. */
function lower(c: number): number {
  return c >= 0x41 && c <= 0x5a ? c + 0x20 : c;
}

/**
 * Whether a segment's pattern (`*` any run, `?` any one code unit, other characters themselves,
 * ASCII letters in any case, as the package's expressions with their `i` flag match them) matches
 * a whole name. Greedy, going back only to the last `*`: at most the product of the two lengths,
 * where an expression with several `[^/]*` may try every way of sharing the name out.
 */
function segmentMatches(pattern: string, name: string): boolean {
  let p = 0;
  let n = 0;
  let star = -1;
  let resume = 0;
  while (n < name.length) {
    const c = pattern.charCodeAt(p);
    if (p < pattern.length && c !== 0x2a && (c === 0x3f || c === lower(name.charCodeAt(n)))) {
      p++;
      n++;
    } else if (p < pattern.length && c === 0x2a) {
      star = p++;
      resume = n;
    } else if (star >= 0) {
      p = star + 1;
      n = ++resume;
    } else {
      return false;
    }
  }
  while (pattern.charCodeAt(p) === 0x2a) p++;
  return p === pattern.length;
}
