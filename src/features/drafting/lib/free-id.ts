/** The first free id `<kind><n>` in the document (ids name steps in Formulas, so keep them short). */
export function freeId(taken: ReadonlySet<string>, base: string): string {
  for (let n = 1; ; n++) if (!taken.has(`${base}${n}`)) return `${base}${n}`;
}
