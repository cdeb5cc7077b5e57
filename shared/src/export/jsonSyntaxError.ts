/** Where a text stops being JSON: 1-based line and column (in UTF-16 code units) and what was expected. */
export interface JsonSyntaxProblem {
  line: number;
  column: number;
  offset: number;
  message: string;
}

const MAX_DEPTH = 1000;

/**
 * Locates the first syntax error of a JSON text (RFC 8259), or returns null when the text is valid.
 * Written out instead of read from `JSON.parse`'s message, whose wording and position format differ
 * between JavaScript engines. Only the grammar is checked; no value is built.
 *
 * @example
 * jsonSyntaxError('{\n  "a": 1,\n}') // { line: 3, column: 1, offset: 12, message: 'expected a property name in double quotes, found "}"' }
 */
export function jsonSyntaxError(text: string): JsonSyntaxProblem | null {
  let i = 0;
  const n = text.length;

  class Stop extends Error {
    constructor(
      public readonly at: number,
      public readonly what: string,
    ) {
      super(what);
    }
  }
  const found = (at: number) => (at >= n ? 'the end of the text' : `${JSON.stringify(text[at])}`);
  const fail = (what: string, at = i): never => {
    throw new Stop(at, `${what}, found ${found(at)}`);
  };
  const ws = () => {
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d) i++;
      else break;
    }
  };
  const string = () => {
    // text[i] === '"'
    i++;
    for (;;) {
      if (i >= n) fail('unterminated string: expected a closing double quote');
      const c = text.charCodeAt(i);
      if (c === 0x22) {
        i++;
        return;
      }
      if (c < 0x20) fail('control character inside a string (write it as an escape such as \\n)');
      if (c === 0x5c) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) fail('expected four hex digits after \\u', i + 2);
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else fail('invalid escape in a string', i + 1);
      } else i++;
    }
  };
  const digits = () => {
    const s = i;
    while (i < n && text.charCodeAt(i) >= 0x30 && text.charCodeAt(i) <= 0x39) i++;
    return i - s;
  };
  const number = () => {
    if (text[i] === '-') i++;
    if (text[i] === '0') i++;
    else if (digits() === 0) fail('expected a digit');
    if (text[i] === '.') {
      i++;
      if (digits() === 0) fail('expected a digit after the decimal point');
    }
    if (text[i] === 'e' || text[i] === 'E') {
      i++;
      if (text[i] === '+' || text[i] === '-') i++;
      if (digits() === 0) fail('expected a digit in the exponent');
    }
  };
  const literal = (word: string) => {
    if (text.startsWith(word, i)) i += word.length;
    else fail('expected a value (object, array, string, number, true, false or null)');
  };
  const value = (depth: number): void => {
    if (depth > MAX_DEPTH) fail(`nested more than ${MAX_DEPTH} levels deep`);
    ws();
    const c = text[i];
    if (c === '{') {
      i++;
      ws();
      if (text[i] === '}') {
        i++;
        return;
      }
      for (;;) {
        ws();
        if (text[i] !== '"') fail('expected a property name in double quotes');
        string();
        ws();
        if (text[i] !== ':') fail('expected ":" after the property name');
        i++;
        value(depth + 1);
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === '}') {
          i++;
          return;
        }
        fail('expected "," or "}" after a property value');
      }
    } else if (c === '[') {
      i++;
      ws();
      if (text[i] === ']') {
        i++;
        return;
      }
      for (;;) {
        value(depth + 1);
        ws();
        if (text[i] === ',') {
          i++;
          continue;
        }
        if (text[i] === ']') {
          i++;
          return;
        }
        fail('expected "," or "]" after an array element');
      }
    } else if (c === '"') string();
    else if (c === '-' || (c !== undefined && c >= '0' && c <= '9')) number();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else fail('expected a value (object, array, string, number, true, false or null)');
  };

  try {
    if (text.charCodeAt(0) === 0xfeff) i = 1; // a byte-order mark is tolerated (as file readers do)
    value(0);
    ws();
    if (i < n) fail('expected the end of the text after the JSON value');
    return null;
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    let line = 1;
    let lineStart = 0;
    for (let k = 0; k < e.at && k < n; k++) {
      if (text.charCodeAt(k) === 0x0a) {
        line++;
        lineStart = k + 1;
      }
    }
    return { line, column: e.at - lineStart + 1, offset: e.at, message: e.what };
  }
}
