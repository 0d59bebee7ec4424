/**
 * Generates docs/checks.md from the check registry: one section per check, with what fires
 * it, an example, how to fix it and its source. A test fails when the committed file differs.
 * `pneumark docs CHECK...` prints the sections of the checks named alone (`renderChecksDocs`).
 */
import type { CheckDef } from './check';
import { CHECKS, docAnchor } from './registry';

/** The caution that ends the documentation and the command line's output. */
export const SUPPORTS = 'Pneumark supports, never replaces, clinical judgement: defer to local protocols and licensed practice.';

export function renderCheckDocs(): string {
  const lines: string[] = [
    '# Pneumark checks',
    '',
    '<!-- Generated from server/src/core/checks/registry.ts by `npm run docs`; do not edit by hand. -->',
    '',
    'Every finding has a stable code. Codes are never reused. Severities are defaults.',
    SUPPORTS,
    '',
    '| Code | Alias | Severity | Title |',
    '|---|---|---|---|',
    ...CHECKS.map((c) => `| [${c.code}](#${docAnchor(c)}) | \`${c.alias}\` | ${c.severity} | ${c.title} |`),
    '',
  ];
  for (const c of CHECKS) lines.push(`<a id="${docAnchor(c)}"></a>`, ...section(c));
  return lines.join('\n');
}

/**
 * The sections of docs/checks.md of the checks given, as they are there (without their anchors),
 * in the order of the registry, each once, then the line that Pneumark supports clinical judgement.
 */
export function renderChecksDocs(checks: readonly CheckDef[]): string {
  const chosen = new Set(checks);
  return [...CHECKS.filter((c) => chosen.has(c)).flatMap(section), SUPPORTS, ''].join('\n');
}

/**
 * The check whose code (in any case: `pn405`) or alias (`driving-pressure-high`) a name is, as
 * `disabledChecks` matches them; null when it is no check's.
 */
export function checkNamed(name: string): CheckDef | null {
  const lower = name.toLowerCase();
  return CHECKS.find((c) => c.code.toLowerCase() === lower || c.alias === lower) ?? null;
}

function section(c: CheckDef): string[] {
  return [
    `## ${c.code} ${c.alias}`,
    '',
    `**${c.title}** — default severity: ${c.severity}; tags: ${c.tags.join(', ')}.`,
    '',
    `**Fires when:** ${c.doc.fires}`,
    '',
    '**Example:**',
    '',
    '```pneu',
    c.doc.example,
    '```',
    '',
    `**Fix:** ${c.doc.fix}`,
    '',
    `**Source:** ${c.source}`,
    '',
  ];
}
