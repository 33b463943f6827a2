/**
 * Writes schema.json at the package root: the JSON Schema of the design file, generated from the zod
 * schema in src/spec/schema.ts. Run with `npx tsx scripts/build-schema.ts`; a test checks that the
 * committed file equals a fresh generation.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { renderDesignSpecJsonSchema } from '../src/spec/json-schema';

const target = fileURLToPath(new URL('../schema.json', import.meta.url));
writeFileSync(target, renderDesignSpecJsonSchema());
