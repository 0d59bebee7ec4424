/**
 * SARIF 2.1.0 export of the findings of one run over several notes, for code-scanning viewers
 * and CI annotations.
 *
 * - One run; `tool.driver` is `pneumark` with one rule per check of CHECKS, in registry order:
 *   id = code (`PN101`), name = alias, shortDescription = title, fullDescription = what fires it,
 *   help = how to fix it and the source, defaultConfiguration.level from the default severity,
 *   properties.tags = the check's tags. No `helpUri` is written: SARIF wants an absolute URI there,
 *   and the documentation (`docs/checks.md`) has no fixed published address; a `file:` URI of one
 *   machine's copy would be wrong on every other machine that opens the log.
 * - Levels: error → error, warning → warning, information and hint → note.
 * - Each finding is a result with ruleId and ruleIndex, its message, one physical location and,
 *   when the finding points elsewhere too, relatedLocations. Regions are 1-based lines and
 *   columns; columns count UTF-16 code units (`columnKind: utf16CodeUnits` on the run), as the
 *   core's ranges do. An empty range becomes an empty region (start = end), a point.
 * - A finding's fixes become `fixes`, each one artifact change whose replacements delete the
 *   edit's region and insert its text.
 * - Paths: backslashes become `/` (unless `backslashSeparates` is false: on POSIX systems a
 *   backslash is a character of a file name, percent-encoded as `%5C`), a leading `./` is dropped, and each segment is
 *   percent-encoded as a URI reference requires (`my notes/a.pneu` → `my%20notes/a.pneu`). A
 *   relative path (the CLI gives paths relative to the working folder) is a relative URI with
 *   `uriBaseId: "SRCROOT"`, declared in the run's `originalUriBaseIds` without an absolute address
 *   (that would put a local folder name into a shared log); an absolute path is an absolute
 *   `file:` URI without a base; standard input (`<stdin>`) has no URI, only a description.
 *   Every file given, read or not, is listed once in `artifacts`; locations name its index.
 * - A note that could not be read becomes a tool execution notification (level error) on the
 *   invocation, and `executionSuccessful` is false when there is any: the run did not check
 *   everything it was asked to (the CLI exits with 2 then). A problem of a settings file given in
 *   `configurationProblems` becomes a tool configuration notification and makes it false too.
 */
import type * as Sarif from 'sarif';
import type { NoteResult } from '../check-note';
import type { CheckDef } from '../checks/check';
import { CHECKS } from '../checks/registry';
import type { Finding, Range, Severity } from '../types';

/**
 * One note of the run: its checked result, or its findings alone (`findings` wins when both are
 * given, so a caller can pass a filtered list), and why it could not be read, if it could not.
 */
export interface SarifFile {
  readonly path: string;
  readonly result?: NoteResult | null;
  readonly findings?: readonly Finding[];
  /** Why the file could not be read, or null. */
  readonly problem: string | null;
}

export interface SarifOptions {
  /** The version of pneumark that produced the log; left out when not given. */
  readonly toolVersion: string;
  /**
   * Whether a backslash in a path separates folders, as on Windows (the default). False where it
   * is a character of a name (Linux, macOS: `ward\bed.pneu` is one file), so it is kept, encoded.
   */
  readonly backslashSeparates?: boolean;
  /**
   * Problems of the settings files (`pneumark.config.json`) the run read: each becomes a tool
   * configuration notification (level error) and makes the execution unsuccessful, as the CLI's
   * exit code 2 does, so a log uploaded from CI does not claim a clean run on other settings than
   * the team wrote.
   */
  readonly configurationProblems?: readonly SarifConfigurationProblem[];
}

/** One problem of a settings file: its path, and the line and column (1-based) when known. */
export interface SarifConfigurationProblem {
  readonly path: string;
  readonly line: number | null;
  readonly column: number | null;
  readonly message: string;
}

export const SARIF_SCHEMA = 'https://json.schemastore.org/sarif-2.1.0.json';

const LEVEL: Readonly<Record<Severity, Sarif.Result.level>> = {
  error: 'error',
  warning: 'warning',
  information: 'note',
  hint: 'note',
};

/**
 * The base of the relative URIs in the log: the folder the paths are relative to (for the CLI, the
 * working folder). Its absolute address is left out on purpose (it would put a local folder name,
 * often a user name, into a log that is shared); a viewer asks for it or assumes the checkout.
 */
export const SARIF_URI_BASE_ID = 'SRCROOT';

/** How the CLI names standard input (`check -`). */
const STDIN_PATH = '<stdin>';

/** How the paths given are written: whether a backslash separates folders (see `SarifOptions`). */
export interface PathStyle {
  readonly backslashSeparates?: boolean;
}

const WINDOWS_OR_POSIX: PathStyle = { backslashSeparates: true };

const encodeSegments = (path: string): string => path.split('/').map((segment) => encodeURIComponent(segment)).join('/');

/**
 * A path as a URI: a relative path as a relative reference (forward slashes, each segment
 * percent-encoded, a leading `./` dropped); an absolute path (`/notes/a.pneu`, `C:\notes\a.pneu`,
 * `\\server\share\a.pneu`) as an absolute `file:` URI.
 */
export function artifactUri(path: string, options: PathStyle = WINDOWS_OR_POSIX): string {
  const slashed = options.backslashSeparates === false ? path : path.replace(/\\/g, '/');
  if (/^\/\/[^/]/.test(slashed)) {
    const [host = '', ...rest] = slashed.slice(2).split('/');
    return `file://${encodeURIComponent(host)}/${encodeSegments(rest.join('/'))}`;
  }
  const drive = /^([A-Za-z]):\//.exec(slashed);
  if (drive) return `file:///${drive[1]}:/${encodeSegments(slashed.slice(3))}`;
  if (slashed.startsWith('/')) return `file://${encodeSegments(slashed)}`;
  return encodeSegments(slashed.replace(/^(\.\/)+/, ''));
}

/**
 * Where a path is, as SARIF says it: a relative URI with `uriBaseId` (resolved against
 * `SRCROOT`), an absolute `file:` URI alone, or for standard input no URI at all (a description).
 */
export function artifactLocationOf(path: string, options: PathStyle = WINDOWS_OR_POSIX): Sarif.ArtifactLocation {
  if (path === STDIN_PATH) return { description: { text: 'standard input' } };
  const uri = artifactUri(path, options);
  return uri.startsWith('file:') ? { uri } : { uri, uriBaseId: SARIF_URI_BASE_ID };
}

function rule(check: CheckDef): Sarif.ReportingDescriptor {
  return {
    id: check.code,
    name: check.alias,
    shortDescription: { text: check.title },
    fullDescription: { text: check.doc.fires },
    help: { text: `${check.doc.fix}\nSource: ${check.source}` },
    defaultConfiguration: { level: LEVEL[check.severity] },
    properties: { tags: [...check.tags] },
  };
}

function region(range: Range): Sarif.Region {
  return {
    startLine: range.start.line + 1,
    startColumn: range.start.character + 1,
    endLine: range.end.line + 1,
    endColumn: range.end.character + 1,
  };
}

function sarifResult(finding: Finding, location: Sarif.ArtifactLocation, ruleIndex: ReadonlyMap<string, number>): Sarif.Result {
  const index = ruleIndex.get(finding.code);
  const result: Sarif.Result = {
    ruleId: finding.code,
    ...(index === undefined ? {} : { ruleIndex: index }),
    level: LEVEL[finding.severity],
    message: { text: finding.message },
    locations: [{ physicalLocation: { artifactLocation: location, region: region(finding.range) } }],
  };
  if (finding.related?.length) {
    result.relatedLocations = finding.related.map((r, i) => ({
      id: i + 1,
      physicalLocation: { artifactLocation: location, region: region(r.range) },
      message: { text: r.message },
    }));
  }
  if (finding.fixes.length) {
    result.fixes = finding.fixes.map((fix) => ({
      description: { text: fix.title },
      artifactChanges: [{
        artifactLocation: location,
        replacements: fix.edits.map((edit) => ({ deletedRegion: region(edit.range), insertedContent: { text: edit.newText } })),
      }],
    }));
  }
  return result;
}

/** A SARIF log of the findings of every readable file, and a notification for every unreadable one. */
export function toSarifLog(files: readonly SarifFile[], options?: SarifOptions): Sarif.Log {
  const parts = sarifLogParts(files, options);
  const results = parts.log.runs[0]!.results!;
  for (const file of files) for (const r of parts.resultsOf(file)) results.push(r);
  return parts.log;
}

/**
 * The log in two parts, for a writer that goes a file at a time (a big folder's log is larger than
 * one string can hold): the log with an empty `results` list, the last member of its only run, and
 * the results of each file of `files`, made when asked for.
 */
export function sarifLogParts(files: readonly SarifFile[], options?: SarifOptions): { readonly log: Sarif.Log; resultsOf(file: SarifFile): Sarif.Result[] } {
  const ruleIndex = new Map(CHECKS.map((c, i) => [c.code, i]));
  const style: PathStyle = { backslashSeparates: options?.backslashSeparates ?? true };
  const artifacts: Sarif.Artifact[] = [];
  const artifactIndex = new Map<string, number>();
  const locationOf = (path: string): Sarif.ArtifactLocation => {
    const location = artifactLocationOf(path, style);
    const key = location.uri ?? path;
    let index = artifactIndex.get(key);
    if (index === undefined) {
      index = artifacts.length;
      artifactIndex.set(key, index);
      artifacts.push({ location });
    }
    return { ...location, index };
  };

  const notifications: Sarif.Notification[] = [];
  for (const file of files) {
    const location = locationOf(file.path);
    if (file.problem !== null) {
      notifications.push({ level: 'error', message: { text: `${file.path}: cannot check: ${file.problem}` }, locations: [{ physicalLocation: { artifactLocation: location } }] });
    }
  }

  const configuration: Sarif.Notification[] = (options?.configurationProblems ?? []).map((p) => {
    const location = artifactLocationOf(p.path, style);
    const region = p.line === null ? {} : { region: { startLine: p.line, ...(p.column === null ? {} : { startColumn: p.column }) } };
    return { level: 'error', message: { text: p.message }, locations: [{ physicalLocation: { artifactLocation: location, ...region } }] };
  });

  const invocation: Sarif.Invocation = {
    executionSuccessful: notifications.length === 0 && configuration.length === 0,
    ...(notifications.length ? { toolExecutionNotifications: notifications } : {}),
    ...(configuration.length ? { toolConfigurationNotifications: configuration } : {}),
  };

  const log: Sarif.Log = {
    $schema: SARIF_SCHEMA,
    version: '2.1.0',
    runs: [{
      tool: {
        driver: {
          name: 'pneumark',
          ...(options?.toolVersion ? { version: options.toolVersion } : {}),
          rules: CHECKS.map(rule),
        },
      },
      invocations: [invocation],
      originalUriBaseIds: { [SARIF_URI_BASE_ID]: { description: { text: 'The folder the paths of the notes are relative to: the working folder of the command.' } } },
      ...(artifacts.length ? { artifacts } : {}),
      columnKind: 'utf16CodeUnits',
      results: [],
    }],
  };
  return {
    log,
    resultsOf(file: SarifFile): Sarif.Result[] {
      const location = locationOf(file.path);
      return (file.findings ?? file.result?.findings ?? []).map((finding) => sarifResult(finding, location, ruleIndex));
    },
  };
}
