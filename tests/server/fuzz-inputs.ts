import fc from 'fast-check';

/**
 * Hostile inputs for the API fuzz test: malformed JSON, wrong types, 1 MB strings, deep nesting,
 * arrays for objects, null bytes, `__proto__` / `constructor` keys, numbers JSON can carry but a
 * form never sends (1e999 parses as Infinity, -0), huge and negative page sizes, and SQL-looking
 * text in every query parameter.
 */

/** A value JSON.stringify cannot write (NaN, 1e999, deep nesting): spliced into the body text as is. */
export class Raw {
  constructor(readonly text: string) {}
}

export const SQLISH = [
  "' OR '1'='1", "1; DROP TABLE diagnoses; --", "'; SELECT pg_sleep(5); --", '1 UNION SELECT password_hash FROM users',
  "\\'; DELETE FROM vehicles WHERE '' = '", '$1', ':shopId', '%', '_', "O'Brien", '--', '/*', '1)) OR ((1=1', "' || (SELECT current_user) || '",
];
const ODD_TEXT = ['', ' ', '\u0000', 'a\u0000b', '\uFEFF', '\uD800', '🔥'.repeat(50), '<script>alert(1)</script>', '../../etc/passwd', '%00', 'NaN', 'Infinity', '-0', 'null', 'undefined', 'true', '[]', '{}'];
const DEEP = 5_000;

const bigString = fc.constantFrom('x'.repeat(1 << 20), '0'.repeat(1 << 20));
const oddString = fc.oneof(fc.constantFrom(...SQLISH, ...ODD_TEXT), fc.string({ maxLength: 40 }), fc.string({ unit: 'binary', maxLength: 40 }));
const oddNumber = fc.oneof(
  fc.constantFrom(0, -1, 1, 2 ** 31, 2 ** 53 + 1, -(2 ** 63), 1e308, 5e-324, 0.1),
  fc.integer(), fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.constantFrom(new Raw('1e999'), new Raw('-1e999'), new Raw('-0'), new Raw('1e-999'), new Raw('123456789012345678901234567890')),
);
const protoKeys = fc.constantFrom(
  new Raw('{"__proto__":{"polluted":true}}'), new Raw('{"constructor":{"prototype":{"polluted":true}}}'),
  new Raw('{"__proto__":null}'), { constructor: 'x', toString: 1, hasOwnProperty: null, valueOf: [] },
);
const deep = fc.constantFrom(new Raw(`${'['.repeat(DEEP)}${']'.repeat(DEEP)}`), new Raw(`${'{"a":'.repeat(DEEP)}1${'}'.repeat(DEEP)}`));

/** A value to put where the API expects something else. */
export const nasty: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: oddString },
  { weight: 3, arbitrary: oddNumber },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false, [], {}, [{}], [null], ['a', 'b']) },
  { weight: 1, arbitrary: protoKeys },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.array(oddString, { maxLength: 5 }) },
  { weight: 1, arbitrary: deep },
  // 1 MB strings are costly to send: about one run in a hundred carries one
  { weight: 1, arbitrary: fc.oneof({ weight: 3, arbitrary: oddString }, { weight: 1, arbitrary: bigString }) },
);

/** Writes a body as JSON text, splicing Raw values in verbatim. */
export function toJsonText(value: unknown): string {
  const raws: string[] = [];
  const text = JSON.stringify(value, (_k, v: unknown) => {
    if (v instanceof Raw) {
      raws.push(v.text);
      return `@@raw${raws.length - 1}@@`;
    }
    return v;
  });
  return (text ?? 'null').replace(/"@@raw(\d+)@@"/g, (_m, i: string) => raws[Number(i)]!);
}

type Path = (string | number)[];

function paths(value: unknown, at: Path = [], out: Path[] = []): Path[] {
  out.push(at);
  if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) if (at.length < 6) paths(v, [...at, Array.isArray(value) ? Number(k) : k], out);
  }
  return out;
}

function replaceAt(value: unknown, path: Path, next: unknown): unknown {
  if (!path.length) return next;
  const [head, ...rest] = path;
  const copy: Record<string | number, unknown> = Array.isArray(value) ? [...(value as unknown[])] as never : { ...(value as object) };
  copy[head!] = replaceAt((value as Record<string | number, unknown>)[head!], rest, next);
  return copy;
}

const MALFORMED = ['{', '{"a":', '[1,2', 'nul', '{"a":1}}', "{'a':1}", '{"a":1,}', '\u0000', '', ' ', 'NaN', '{"a":NaN}', '{"a":Infinity}', '{"a":undefined}', '"\\ud800"', '01', '{"a":0x10}'];

/** A body: malformed text, any JSON, or the route's valid example with one part replaced or one key added. */
export function bodyFor(example: unknown): fc.Arbitrary<{ text: string; describe: string }> {
  const all = paths(example);
  const mutated = fc.tuple(fc.constantFrom(...all), nasty).map(([p, v]) => ({ text: toJsonText(replaceAt(example, p, v)), describe: `example with ${p.join('.') || '(root)'} replaced` }));
  const extraKey = fc.tuple(fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'id', 'shopId', 'shop_id', 'role', 'roles'), nasty)
    .map(([k, v]) => ({ text: toJsonText(example).replace(/^\{/, `{${JSON.stringify(k)}:${toJsonText(v)},`), describe: `example with an extra ${k} key` }));
  return fc.oneof(
    { weight: 6, arbitrary: mutated },
    { weight: 2, arbitrary: example && typeof example === 'object' && !Array.isArray(example) ? extraKey : mutated },
    { weight: 1, arbitrary: fc.oneof(fc.constantFrom(...MALFORMED), fc.string({ maxLength: 30 })).map((text) => ({ text, describe: 'malformed JSON' })) },
    { weight: 1, arbitrary: nasty.map((v) => ({ text: toJsonText(v), describe: 'some other JSON value' })) },
    { weight: 1, arbitrary: fc.constant(example).map((e) => ({ text: toJsonText([e]), describe: 'an array for the object' })) },
  );
}

const QUERY_KEYS = ['q', 'page', 'pageSize', 'status', 'procedureId', 'versionId', 'technicianId', 'from', 'to', 'sort', 'dir', 'mine', 'archived', 'symptom', 'ignitionSystem', 'vehicle', 'flag', 'endingStepId'];
const queryValue = fc.oneof(
  fc.constantFrom(...SQLISH),
  fc.constantFrom('-1', '0', '1e9', '99999999999999999999', 'NaN', 'Infinity', '-0', '1.5', '', '2026-02-30', '9999-99-99', 'desc; --', '00000000-0000-0000-0000-000000000000'),
  oddString,
);

/** A query string: known keys with hostile values, repeated keys (arrays), and unknown keys. */
export const queryString: fc.Arbitrary<string> = fc.array(
  fc.tuple(fc.oneof({ weight: 5, arbitrary: fc.constantFrom(...QUERY_KEYS) }, { weight: 1, arbitrary: fc.constantFrom('__proto__', 'constructor', 'page[]', 'a[b]', '') }), queryValue),
  { maxLength: 6 },
).map((pairs) => pairs.map(([k, v]) => `${urlEncode(k)}=${urlEncode(v)}`).join('&'));

/** Percent-encodes the UTF-8 bytes of any string (a lone surrogate becomes U+FFFD, as a browser sends it). */
export function urlEncode(text: string): string {
  return [...Buffer.from(text, 'utf8')].map((b) => (/[A-Za-z0-9\-_.~]/.test(String.fromCharCode(b)) ? String.fromCharCode(b) : `%${b.toString(16).padStart(2, '0').toUpperCase()}`)).join('');
}

/** A path parameter, already encoded: the real id most of the time, or something that is not one (broken escapes too). */
export function paramValue(real: string): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 4, arbitrary: fc.constant(real) },
    { weight: 1, arbitrary: fc.oneof(fc.constantFrom(...SQLISH, '..', 'x'.repeat(5000), real.toUpperCase()), oddString.filter((s) => s.length > 0)).map(urlEncode) },
    { weight: 1, arbitrary: fc.constantFrom('%', '%zz', '%C0%AF', '%E0%A4%A', '%00', '%2e%2e', '%2F..%2F') },
  );
}
