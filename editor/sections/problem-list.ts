// The problem list shown under a failed file load: one item per problem, its JSON path in code, at most 12 items.

/** Problems listed at most; the rest are counted in a last item. */
const MAX_LISTED = 12;

/** A `<ul>` of problems by JSON path ('' = the whole document), with class `className`. */
export function problemList(doc: Document, problems: readonly { path: string; message: string }[], className: string): HTMLUListElement {
  const list = doc.createElement('ul');
  list.className = className;
  for (const p of problems.slice(0, MAX_LISTED)) {
    const li = doc.createElement('li');
    const code = doc.createElement('code');
    code.textContent = p.path === '' ? '(document)' : p.path;
    li.append(code, ` ${p.message}`);
    list.appendChild(li);
  }
  if (problems.length > MAX_LISTED) {
    const li = doc.createElement('li');
    li.textContent = `… and ${problems.length - MAX_LISTED} more`;
    list.appendChild(li);
  }
  return list;
}
