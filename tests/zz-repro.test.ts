import { it } from 'vitest';
import { checkNote } from '../server/src/core/check-note';
import { applyEdits, codeActions } from '../server/src/core/service';
it('r', () => {
  const text = 'abg,0.0/9/7.35/0.0 kpa po2 9.5 #expect: PN201\noxygen room air #expect: PN201';
  const r = checkNote(text);
  for (const f of r.findings) { console.log(f.code, f.message, JSON.stringify(f.range));
    for (const a of codeActions(r, f.range)) { if (a.kind==='refactor.rewrite') continue; const after = applyEdits(text, a.edits); console.log('  ', a.title, JSON.stringify(after)); for (const g of checkNote(after).findings) console.log('     ', g.code, g.message, g.range.start.character); } }
});
