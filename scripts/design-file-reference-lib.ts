/** The Markdown rendering of the design-file reference, shared by the script and its test. */

export const REFERENCE_START = '<!-- design-file-reference:start (generated from schema.json by scripts/design-file-reference.ts) -->';
export const REFERENCE_END = '<!-- design-file-reference:end -->';

type Schema = {
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  anyOf?: Schema[];
  oneOf?: Schema[];
  properties?: Record<string, Schema>;
  items?: Schema | false;
  prefixItems?: Schema[];
  default?: unknown;
  description?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
};

function typeOf(s: Schema): string {
  if (s.enum) return s.enum.map((e) => `\`${JSON.stringify(e)}\``).join(' | ');
  if (s.const !== undefined) return `\`${JSON.stringify(s.const)}\``;
  const alts = s.anyOf ?? s.oneOf;
  if (alts) {
    const names = [...new Set(alts.map(typeOf))];
    if (names.includes('number') && names.some((n) => n.startsWith('string'))) {
      return names.filter((n) => !n.startsWith('string')).map((n) => (n === 'number' ? 'number or quantity string' : n)).join(' or ');
    }
    return names.join(' or ');
  }
  if (s.prefixItems) return `[${s.prefixItems.map(typeOf).join(', ')}]`;
  if (s.type === 'array' && s.items) return `array of ${typeOf(s.items)}`;
  if (Array.isArray(s.type)) return s.type.join(' or ');
  let t = s.type ?? 'any';
  if (t === 'number' || t === 'integer') {
    const lo = s.minimum ?? s.exclusiveMinimum;
    if (lo !== undefined || s.maximum !== undefined) t += ` (${lo ?? ''}..${s.maximum ?? ''})`;
  }
  return t;
}

const cell = (text: string): string => text.replace(/\|/g, '\\|').replace(/\n/g, ' ');

/** Rows for every leaf and object field, depth first, in schema order. */
function rows(s: Schema, path: string, out: string[]): void {
  const alts = s.anyOf ?? s.oneOf;
  if (s.properties) {
    if (path) out.push(`| \`${path}\` | object | | ${cell(s.description ?? '')} |`);
    for (const [key, child] of Object.entries(s.properties)) {
      if (key === '$schema') continue;
      rows(child, path ? `${path}.${key}` : key, out);
    }
    return;
  }
  if (alts && alts.some((a) => a.properties)) {
    out.push(`| \`${path}\` | one of ${alts.length} forms | | ${cell(s.description ?? '')} |`);
    alts.forEach((a) => {
      const tag = Object.entries(a.properties ?? {}).find(([, v]) => v.const !== undefined || (v.enum && v.enum.length === 1));
      const label = tag ? `${tag[0]}=${JSON.stringify(tag[1].const ?? tag[1].enum![0])}` : 'form';
      for (const [key, child] of Object.entries(a.properties ?? {})) rows(child, `${path}{${label}}.${key}`, out);
    });
    return;
  }
  const def = s.default === undefined ? '' : `\`${JSON.stringify(s.default)}\``;
  out.push(`| \`${path}\` | ${cell(typeOf(s))} | ${cell(def)} | ${cell(s.description ?? '')} |`);
}

export function renderDesignFileReference(schema: Schema): string {
  const out: string[] = ['| field | type | default | meaning |', '| --- | --- | --- | --- |'];
  rows(schema, '', out);
  return out.join('\n');
}

export function replaceReferenceSection(readme: string, body: string): string {
  const a = readme.indexOf(REFERENCE_START);
  const b = readme.indexOf(REFERENCE_END);
  if (a < 0 || b < a) throw new Error('README.md has no design-file reference markers');
  return `${readme.slice(0, a + REFERENCE_START.length)}\n${body}\n${readme.slice(b)}`;
}
