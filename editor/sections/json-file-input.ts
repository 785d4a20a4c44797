// A hidden file input for picking a JSON document; the sections' "Load …" buttons click it.

/** Creates a hidden `<input type="file">` for JSON with the given id, appended to the body; `onText` gets the file's text and name. */
export function createJsonFileInput(doc: Document, id: string, onText: (text: string, name: string) => void): HTMLInputElement {
  const input = doc.createElement('input');
  input.type = 'file';
  input.accept = '.json,application/json';
  input.id = id;
  input.style.display = 'none';
  input.addEventListener('change', async () => {
    const file = input.files?.[0];
    if (!file) return;
    const text = await file.text();
    input.value = '';
    onText(text, file.name);
  });
  doc.body.appendChild(input);
  return input;
}
