/** Joins class names, skipping falsy ones. Example: cx('a', false && 'b', 'c') === 'a c' */
export function cx(...parts: (string | false | null | undefined)[]): string {
  return parts.filter(Boolean).join(' ');
}
