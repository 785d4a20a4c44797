// A small JSON Schema (draft 2020-12) validator for the keywords our tuning schema uses; test helper only.

type Schema = Record<string, any>;

/** Validates `value` against `schema` (root `root` for local $refs); returns the failing instance paths. */
export function validateSchema(value: unknown, schema: Schema, root: Schema = schema, path = ''): string[] {
  if (schema.$ref) {
    const ref: string = schema.$ref;
    if (!ref.startsWith('#/')) throw new Error(`unsupported $ref ${ref}`);
    const target = ref.slice(2).split('/').reduce((s: any, k) => s[k], root);
    return validateSchema(value, target, root, path);
  }
  const errors: string[] = [];
  const fail = (why: string) => errors.push(`${path || '(document)'}: ${why}`);
  if ('const' in schema && value !== schema.const) fail(`must equal ${schema.const}`);
  if (schema.enum && !schema.enum.includes(value)) fail('not in enum');
  if (schema.type) {
    const types: string[] = Array.isArray(schema.type) ? schema.type : [schema.type];
    const ok = types.some((t) => {
      if (t === 'null') return value === null;
      if (t === 'integer') return typeof value === 'number' && Number.isInteger(value);
      if (t === 'number') return typeof value === 'number' && Number.isFinite(value);
      if (t === 'array') return Array.isArray(value);
      if (t === 'object') return value !== null && typeof value === 'object' && !Array.isArray(value);
      return typeof value === t;
    });
    if (!ok) {
      fail(`expected ${types.join('|')}`);
      return errors;
    }
  }
  if (typeof value === 'number') {
    if (schema.minimum !== undefined && value < schema.minimum) fail('below minimum');
    if (schema.maximum !== undefined && value > schema.maximum) fail('above maximum');
  }
  if (Array.isArray(value)) {
    if (schema.minItems !== undefined && value.length < schema.minItems) fail('too few items');
    if (schema.maxItems !== undefined && value.length > schema.maxItems) fail('too many items');
    if (schema.items) value.forEach((v, i) => errors.push(...validateSchema(v, schema.items, root, `${path}[${i}]`)));
  } else if (value !== null && typeof value === 'object') {
    const obj = value as Record<string, unknown>;
    const keys = Object.keys(obj);
    for (const r of schema.required ?? []) if (!Object.prototype.hasOwnProperty.call(obj, r)) fail(`missing ${r}`);
    if (schema.minProperties !== undefined && keys.length < schema.minProperties) fail('too few properties');
    if (schema.maxProperties !== undefined && keys.length > schema.maxProperties) fail('too many properties');
    for (const k of keys) {
      const p = path ? `${path}.${k}` : k;
      if (schema.propertyNames) errors.push(...validateSchema(k, { type: 'string', ...schema.propertyNames }, root, `${p} (name)`));
      if (schema.properties && k in schema.properties && Object.prototype.hasOwnProperty.call(schema.properties, k)) {
        errors.push(...validateSchema(obj[k], schema.properties[k], root, p));
      } else if (schema.additionalProperties === false) fail(`unknown key ${k}`);
      else if (schema.additionalProperties && typeof schema.additionalProperties === 'object') {
        errors.push(...validateSchema(obj[k], schema.additionalProperties, root, p));
      }
    }
  }
  if (typeof value === 'string' && schema.pattern && !new RegExp(schema.pattern, 'u').test(value)) fail('pattern mismatch');
  if (schema.not && validateSchema(value, schema.not, root, path).length === 0) fail('matches a forbidden schema');
  return errors;
}
