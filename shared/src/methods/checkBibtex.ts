/** One BibTeX entry as read by `checkBibtex`: type, key and field names with their raw values. */
export interface BibtexEntry {
  type: string;
  key: string;
  fields: Map<string, string>;
}

/** Fields an entry of each type must have (one of the alternatives separated by '|'). */
export const BIBTEX_REQUIRED: Record<string, string[]> = {
  article: ['author', 'title', 'journal', 'year'],
  book: ['author|editor', 'title', 'publisher', 'year'],
  misc: ['title'],
  incollection: ['author', 'title', 'booktitle', 'publisher', 'year'],
  inproceedings: ['author', 'title', 'booktitle', 'year'],
};

/**
 * A small structural reader of BibTeX for checks: entries `@type{key, name = {value} | "value" | 123, …}`.
 * Reports unbalanced braces, unknown entry types, duplicate keys and missing required fields. Not a
 * full BibTeX parser (no @string, @comment or concatenation with #).
 *
 * @example
 * checkBibtex('@book{k, title = {T}}').problems // ['k: book lacks author|editor', 'k: book lacks publisher', 'k: book lacks year']
 */
export function checkBibtex(text: string): { entries: BibtexEntry[]; problems: string[] } {
  const entries: BibtexEntry[] = [];
  const problems: string[] = [];
  let i = 0;
  const n = text.length;
  const skipWs = () => {
    while (i < n && /\s/.test(text[i])) i++;
  };
  while (i < n) {
    const at = text.indexOf('@', i);
    if (at < 0) break;
    i = at + 1;
    const typeMatch = /^[A-Za-z]+/.exec(text.slice(i));
    if (!typeMatch) {
      problems.push(`character ${at}: "@" not followed by an entry type`);
      continue;
    }
    const type = typeMatch[0].toLowerCase();
    i += typeMatch[0].length;
    skipWs();
    if (text[i] !== '{') {
      problems.push(`character ${i}: expected "{" after @${type}`);
      continue;
    }
    // Find the matching closing brace of the entry.
    let depth = 0;
    let end = -1;
    for (let k = i; k < n; k++) {
      if (text[k] === '\\') {
        k++;
        continue;
      }
      if (text[k] === '{') depth++;
      else if (text[k] === '}') {
        depth--;
        if (depth === 0) {
          end = k;
          break;
        }
        if (depth < 0) break;
      }
    }
    if (end < 0) {
      problems.push(`@${type} at character ${at}: unbalanced braces`);
      break;
    }
    const body = text.slice(i + 1, end);
    i = end + 1;
    const comma = body.indexOf(',');
    const key = (comma < 0 ? body : body.slice(0, comma)).trim();
    if (!/^[^\s,{}"#%'()=]+$/.test(key)) problems.push(`@${type} at character ${at}: invalid key ${JSON.stringify(key)}`);
    const fields = new Map<string, string>();
    let j = comma < 0 ? body.length : comma + 1;
    while (j < body.length) {
      const m = /^\s*([A-Za-z][\w-]*)\s*=\s*/.exec(body.slice(j));
      if (!m) {
        if (body.slice(j).trim() !== '') problems.push(`${key}: cannot read a field at ${JSON.stringify(body.slice(j, j + 20))}`);
        break;
      }
      const name = m[1].toLowerCase();
      j += m[0].length;
      let value = '';
      if (body[j] === '{') {
        let d = 0;
        const s = j;
        for (; j < body.length; j++) {
          if (body[j] === '\\') {
            j++;
            continue;
          }
          if (body[j] === '{') d++;
          else if (body[j] === '}' && --d === 0) break;
        }
        if (d !== 0) {
          problems.push(`${key}: unbalanced braces in field ${name}`);
          break;
        }
        value = body.slice(s + 1, j);
        j++;
      } else if (body[j] === '"') {
        const close = body.indexOf('"', j + 1);
        if (close < 0) {
          problems.push(`${key}: unterminated quoted field ${name}`);
          break;
        }
        value = body.slice(j + 1, close);
        j = close + 1;
      } else {
        const m2 = /^[\w-]+/.exec(body.slice(j));
        if (!m2) {
          problems.push(`${key}: field ${name} has no value`);
          break;
        }
        value = m2[0];
        j += m2[0].length;
      }
      if (fields.has(name)) problems.push(`${key}: field ${name} appears twice`);
      fields.set(name, value);
      const rest = /^\s*(,|$)/.exec(body.slice(j));
      if (!rest) {
        problems.push(`${key}: expected "," after field ${name}`);
        break;
      }
      j += rest[0].length;
    }
    if (entries.some((e) => e.key === key)) problems.push(`${key}: duplicate key`);
    const required = BIBTEX_REQUIRED[type];
    if (!required) problems.push(`${key}: unknown entry type @${type}`);
    else for (const r of required) if (!r.split('|').some((f) => (fields.get(f) ?? '').trim() !== '')) problems.push(`${key}: ${type} lacks ${r}`);
    entries.push({ type, key, fields });
  }
  return { entries, problems };
}
