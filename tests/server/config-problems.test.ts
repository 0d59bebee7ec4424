// What the server says on a pneumark.config.json with problems once no open note reads it, while
// open notes below it read a nearer file (config-problems.ts): each kind of problem that says the
// defaults apply says so of the notes that would read it; any other problem is said as it is.
import { describe, expect, it } from 'vitest';
import { parseProjectConfig } from '../../server/src/core/config';
import { saysDefaultsApply, supersededMessage } from '../../server/src/server/config-problems';

const problems = (text: string) => parseProjectConfig(text).problems.map((p) => p.message);

describe('the problems of a project file a nearer one stands in for', () => {
  it('say that the notes open read the nearer file, and that a note reading this one gets the defaults', () => {
    const [json] = problems('{ "gasUnit": "kPa", }');
    expect(saysDefaultsApply(json!)).toBe(true);
    expect(supersededMessage(json!)).toBe("pneumark.config.json is not valid JSON (a comma cannot come just before `}`); the open notes below it read a nearer pneumark.config.json, and a note that reads this one gets Pneumark's defaults until it is fixed.");
    const [setting] = problems('{ "bogus": 1 }');
    expect(supersededMessage(setting!)).toBe("pneumark.config.json: `bogus` is not a setting. The open notes below it read a nearer pneumark.config.json, and a note that reads this one gets Pneumark's defaults until it is fixed.");
    // Those the server's file reader writes (node/project-config.ts).
    expect(supersededMessage('pneumark.config.json is larger than 1 MB; Pneumark uses its defaults.')).toBe("pneumark.config.json is larger than 1 MB; the open notes below it read a nearer pneumark.config.json, and a note that reads this one gets Pneumark's defaults until it is fixed.");
    expect(supersededMessage('pneumark.config.json is a symbolic link to a file whose name does not end in .json, so Pneumark does not read it; it uses its defaults.'))
      .toBe("pneumark.config.json is a symbolic link to a file whose name does not end in .json, so Pneumark does not read it; the open notes below it read a nearer pneumark.config.json, and a note that reads this one gets Pneumark's defaults until it is fixed.");
  });

  it('leave a problem that does not say the defaults apply as it is (a file whose settings apply, but for an unknown check)', () => {
    const [unknown] = problems('{ "disabledChecks": ["PN 101"] }');
    expect(unknown).toBeDefined();
    expect(saysDefaultsApply(unknown!)).toBe(false);
    expect(supersededMessage(unknown!)).toBe(unknown);
  });
});
