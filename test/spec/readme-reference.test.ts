import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { renderDesignFileReference, replaceReferenceSection } from '../../scripts/design-file-reference-lib';

const root = join(__dirname, '..', '..');

describe('README design-file reference', () => {
  it('is the current rendering of schema.json (run npx tsx scripts/design-file-reference.ts)', () => {
    const schema = JSON.parse(readFileSync(join(root, 'schema.json'), 'utf8'));
    const readme = readFileSync(join(root, 'README.md'), 'utf8');
    expect(replaceReferenceSection(readme, renderDesignFileReference(schema))).toBe(readme);
  });

  it('documents every top-level section of the design file', () => {
    const schema = JSON.parse(readFileSync(join(root, 'schema.json'), 'utf8'));
    const body = renderDesignFileReference(schema);
    for (const key of Object.keys(schema.properties).filter((k) => k !== '$schema')) expect(body).toContain(`| \`${key}`);
  });
});
