import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { renderDesignSpecJsonSchema, designSpecSchemaDocument } from '../../src/spec/json-schema';

describe('schema.json', () => {
  it('is the committed output of scripts/build-schema.ts (regenerate with `npx tsx scripts/build-schema.ts`)', () => {
    const committed = readFileSync(fileURLToPath(new URL('../../schema.json', import.meta.url)), 'utf8');
    expect(committed).toBe(renderDesignSpecJsonSchema());
  });
  it('describes every property and forbids unknown keys in every object', () => {
    const missing: string[] = [];
    const open: string[] = [];
    const walk = (node: unknown, path: string): void => {
      if (typeof node !== 'object' || node === null) return;
      const n = node as Record<string, unknown>;
      if (n.type === 'object' && n.properties) {
        if (n.additionalProperties !== false) open.push(path);
        for (const [k, v] of Object.entries(n.properties as Record<string, Record<string, unknown>>)) {
          if (typeof v.description !== 'string' || v.description.length === 0) missing.push(`${path}.${k}`);
        }
      }
      for (const [k, v] of Object.entries(n)) if (typeof v === 'object') walk(v, `${path}/${k}`);
    };
    walk(designSpecSchemaDocument(), '');
    expect(missing).toEqual([]);
    expect(open).toEqual([]);
  });
});
