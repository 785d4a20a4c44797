// Tuning text before JSON.parse: a size bound checked first, then a single pass over the (already valid) JSON text
// that finds keys repeated within one object, which JSON.parse would silently resolve to the last one
// (RFC 8259 §4: names within an object SHOULD be unique; docs/references.md §19.2).
import { childPath, itemPath } from './json-path';

/** Largest tuning text accepted, in UTF-16 code units (≈ bytes for ASCII JSON): 4 MiB; the largest valid tuning is about 1 MB compact-indented, 2.7 MB at an 8-space indent. */
export const MAX_TUNING_TEXT = 4 * 1024 * 1024;

/** One repeated key: the JSON path of the repeat and the key. */
export interface DuplicateKey {
  path: string;
  key: string;
}

interface Frame {
  keys: Set<string> | null; // null for arrays
  index: number;
  key: string;
}

/** Keys repeated within one object of `text` (valid JSON), in document order, at most `limit` of them. */
export function findDuplicateKeys(text: string, limit = 100): DuplicateKey[] {
  const found: DuplicateKey[] = [];
  const stack: Frame[] = [];
  let expectKey = false;
  const n = text.length;
  for (let i = 0; i < n && found.length < limit; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22) {
      // A string: find its end, honouring backslash escapes.
      let j = i + 1;
      let escaped = false;
      for (; j < n; j++) {
        const d = text.charCodeAt(j);
        if (d === 0x5c) {
          escaped = true;
          j++;
        } else if (d === 0x22) break;
      }
      if (expectKey) {
        const raw = text.slice(i + 1, j);
        const key = escaped ? (JSON.parse(text.slice(i, j + 1)) as string) : raw;
        const top = stack[stack.length - 1];
        if (top.keys!.has(key)) found.push({ path: pathOf(stack, key), key });
        else top.keys!.add(key);
        top.key = key;
        expectKey = false;
      }
      i = j;
    } else if (c === 0x7b) {
      stack.push({ keys: new Set(), index: 0, key: '' });
      expectKey = true;
    } else if (c === 0x5b) {
      stack.push({ keys: null, index: 0, key: '' });
    } else if (c === 0x7d || c === 0x5d) {
      stack.pop();
    } else if (c === 0x2c) {
      const top = stack[stack.length - 1];
      if (top.keys === null) top.index++;
      else expectKey = true;
    }
  }
  return found;
}

function pathOf(stack: readonly Frame[], key: string): string {
  let p = '';
  for (let k = 0; k < stack.length - 1; k++) {
    const f = stack[k];
    p = f.keys === null ? itemPath(p, f.index) : childPath(p, f.key);
  }
  return childPath(p, key);
}
