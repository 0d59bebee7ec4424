/**
 * The same text as a string of its own, in one piece. In V8 a substring can be a view into the
 * string it was cut from (and keep all of it alive), and a string built by concatenation is a
 * tree of its pieces until it is read. Text kept for long (a changed line, a finding's message)
 * is better copied once: one object, holding nothing else. Slicing a concatenation copies it.
 */
export function ownString(text: string): string {
  return ` ${text}`.slice(1);
}
