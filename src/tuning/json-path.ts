// JSON paths for tuning issues: dotted names, [n] for array items, ["…"] for names that are not identifiers.

const plainName = /^[A-Za-z_$][A-Za-z0-9_$-]*$/;

/** Path of `key` inside the object at `parent` ('' is the document itself). */
export function childPath(parent: string, key: string): string {
  if (!plainName.test(key)) return `${parent}[${JSON.stringify(key)}]`;
  return parent === '' ? key : `${parent}.${key}`;
}

/** Path of item `index` of the array at `parent`. */
export function itemPath(parent: string, index: number): string {
  return `${parent}[${index}]`;
}
