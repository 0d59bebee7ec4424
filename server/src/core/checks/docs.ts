/**
 * Generates docs/checks.md from the check registry: one section per check, with what fires
 * it, an example, how to fix it and its source. A test fails when the committed file differs.
 */
import { CHECKS, docAnchor } from './registry';

export function renderCheckDocs(): string {
  const lines: string[] = [
    '# Pneumark checks',
    '',
    '<!-- Generated from server/src/core/checks/registry.ts by `npm run docs`; do not edit by hand. -->',
    '',
    'Every finding has a stable code. Codes are never reused. Severities are defaults.',
    'Pneumark supports, never replaces, clinical judgement: defer to local protocols and licensed practice.',
    '',
    '| Code | Alias | Severity | Title |',
    '|---|---|---|---|',
    ...CHECKS.map((c) => `| [${c.code}](#${docAnchor(c)}) | \`${c.alias}\` | ${c.severity} | ${c.title} |`),
    '',
  ];
  for (const c of CHECKS) {
    lines.push(
      `<a id="${docAnchor(c)}"></a>`,
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
    );
  }
  return lines.join('\n');
}
