/**
 * Renders the design-file reference (every field: path, type, default, description) from the JSON
 * Schema and writes it into README.md between the reference markers. Run with
 * `npx tsx scripts/design-file-reference.ts`; test/spec/readme-reference.test.ts checks README is current.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { renderDesignFileReference, replaceReferenceSection } from './design-file-reference-lib';

const schema = JSON.parse(readFileSync(fileURLToPath(new URL('../schema.json', import.meta.url)), 'utf8'));
const readmePath = fileURLToPath(new URL('../README.md', import.meta.url));
const readme = readFileSync(readmePath, 'utf8');
writeFileSync(readmePath, replaceReferenceSection(readme, renderDesignFileReference(schema)));
