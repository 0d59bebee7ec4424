import { describe, expect, it } from 'vitest';
import { chunkLine, LEXED, moreWordsOf, releaseWords, scanNumber, scanWord, SCANNED, wordsIn, wordsOf, type Vocabulary } from '../../server/src/core/syntax/lexer';

describe('lexer', () => {
  it('cuts words at blanks and separating commas, keeping a decimal comma inside its word', () => {
    expect(wordsOf('vitals hr 80,rr 7,5 ,  bp 120/80').map((w) => [w.text, w.start, w.end, w.afterComma])).toEqual([
      ['vitals', 0, 6, false], ['hr', 7, 9, false], ['80', 10, 12, false], ['rr', 13, 15, true], ['7,5', 16, 19, false], ['bp', 23, 25, true], ['120/80', 26, 32, false],
    ]);
  });

  it('cuts words at every blank, ASCII or not, and keeps a comma only between two digits', () => {
    const line = '\u00a0a\tb\u3000c\u2003d\ufeffé,f ,7 8, 9,,x 1,2,3 ,5, 6';
    expect(wordsOf(line).map((w) => [w.text, w.start, w.end, w.afterComma])).toEqual([
      ['a', 1, 2, false], ['b', 3, 4, false], ['c', 5, 6, false], ['d', 7, 8, false], ['é', 9, 10, false], ['f', 11, 12, true],
      ['7', 14, 15, true], ['8', 16, 17, false], ['9', 19, 20, true], ['x', 22, 23, true], ['1,2,3', 24, 29, false], ['5', 31, 32, true], ['6', 34, 35, true],
    ]);
    releaseWords();
  });

  it('reuses its words for the next line; chunkLine gives chunks of their own', () => {
    const kept = chunkLine('abg po2 71');
    const first = wordsOf('vitals hr 80');
    const again = wordsOf('oxygen room air');
    expect(again[0]).toBe(first[0]);
    expect(first[0]?.text).toBe('oxygen');
    expect(kept.map((c) => c.text)).toEqual(['abg', 'po2', '71']);
    // A span read from a word is a copy: it stays as it was when the word is reused.
    const span = again[1]!.span;
    wordsOf('x');
    expect(span).toEqual({ start: 7, end: 11 });
  });

  it('gives a shorter line a list of exactly its words, and a longer one after it all of its own', () => {
    expect(wordsOf('vitals hr 80, rr 18, spo2 95 %').length).toBe(8);
    const short = wordsOf('note ok');
    expect(short.map((w) => w.text)).toEqual(['note', 'ok']);
    expect(short.length).toBe(2);
    expect(wordsOf('').length).toBe(0);
    expect(wordsOf('a b c').map((w) => w.text)).toEqual(['a', 'b', 'c']);
    expect(wordsOf('vent peep 5, vt 400 mL').map((w) => w.text)).toEqual(['vent', 'peep', '5', 'vt', '400', 'mL']);
    releaseWords();
  });

  it('lets go of the texts of the words it handed out', () => {
    const words = wordsOf('note a long word: pneumothoraces');
    releaseWords();
    expect(words.every((w) => w.text === '')).toBe(true);
  });

  it('stops after `max` words, and reads on from there as if it had not stopped', () => {
    const line = 'vitals, hr 80,, rr 18 ,,spo2 95 %';
    const whole = wordsOf(line).map((w) => [w.text, w.start, w.end, w.afterComma]);
    const doubled = LEXED.doubledComma;
    const two = wordsOf(line, 0, undefined, 2);
    expect(two.map((w) => w.text)).toEqual(['vitals', 'hr']);
    expect(LEXED.doubledComma).toBe(false);
    expect(moreWordsOf(undefined, 4).map((w) => w.text)).toEqual(['vitals', 'hr', '80', 'rr']);
    const rest = moreWordsOf().map((w) => [w.text, w.start, w.end, w.afterComma]);
    expect(rest).toEqual(whole);
    expect(LEXED.doubledComma).toBe(doubled);
    expect(doubled).toBe(true);
    // Nothing left to read: the same list.
    expect(moreWordsOf().length).toBe(whole.length);
    // A line of as many words as `max` is read whole.
    expect(wordsOf('a b', 0, undefined, 2).map((w) => w.text)).toEqual(['a', 'b']);
    expect(LEXED.stoppedAt).toBe(-1);
    releaseWords();
  });

  it('lets go of the words of every line read since it last let go, not only the last line\'s', () => {
    const long = wordsOf('note a long line of prose: pneumothoraces').slice();
    const short = wordsOf('vitals hr 80').slice();
    releaseWords();
    expect([...long, ...short].every((w) => w.text === '' && w.source === '')).toBe(true);
  });

  it('gives a word of the vocabulary its kept text and its index, and no other word either', () => {
    const words = ['hr', 'vitals'];
    const vocabulary: Vocabulary = { words, indexAt: (body, start, end) => words.indexOf(body.slice(start, end)) };
    const line = 'vitals hr 80 hrs';
    const read = wordsOf(line, 0, vocabulary);
    expect(read.map((w) => [w.text, w.known])).toEqual([['vitals', 1], ['hr', 0], ['80', -1], ['hrs', -1]]);
    // A word given another text is no longer the word of the vocabulary it was.
    read[1]!.text = 'h';
    expect(read[1]!.known).toBe(-1);
    releaseWords();
    expect(read[0]!.known).toBe(-1);
  });

  it('reads a line inside a longer text by offsets as it reads the line alone, its places counted from the line', () => {
    const words = ['hr', 'vitals'];
    const vocabulary: Vocabulary = { words, indexAt: (body, start, end) => words.indexOf(body.slice(start, end)) };
    const seen = (read: ReturnType<typeof wordsOf>) => read.map((w) => {
      const scanned = scanWord(w);
      return [w.text, w.start, w.end, w.afterComma, w.known, scanned, scanned > 0 ? SCANNED.value : null];
    });
    // Each line body in its note: before a comment, before `\r\n`, `\r` or `\n`, and at the end of the note.
    const note = 'x\nvitals hr 7,5 rr -#,5\r\n ,hr 80,, 7 ,9\r-,5 1.\n,5 hr 1234567890123456789';
    for (const [base, length] of [[2, 18], [25, 14], [40, 6], [47, 25]] as const) {
      const line = note.slice(base, base + length);
      const alone = seen(wordsOf(line, 0, vocabulary));
      const doubled = LEXED.doubledComma;
      expect(seen(wordsIn(note, base, length, vocabulary)), line).toEqual(alone);
      expect(LEXED.doubledComma).toBe(doubled);
      // Stopped after two words, it reads on in the same line.
      expect(wordsIn(note, base, length, vocabulary, 2).length).toBe(Math.min(2, alone.length));
      expect(seen(moreWordsOf(vocabulary)), line).toEqual(alone);
      expect(LEXED.doubledComma).toBe(doubled);
    }
    releaseWords();
  });

  it('reads a number without an object per number', () => {
    expect(scanNumber('7,35x')).toBe(4);
    expect([SCANNED.value, SCANNED.decimalComma]).toEqual([7.35, true]);
    expect(scanNumber('-12')).toBe(3);
    expect(SCANNED.value).toBe(-12);
    expect(scanNumber('abc')).toBe(0);
    expect(scanNumber('x 42', 2)).toBe(2);
  });
});
