/**
 * The JSON Schema of the design file as shipped (`gicladder/schema.json`): generated from the zod
 * schema (zod's toJSONSchema, input form, draft 2020-12) with a title and an id, rendered as stable
 * text (two-space indentation, final newline) so the committed file can be compared byte for byte.
 */
import { designSpecJsonSchema } from './schema';

/** Where editors can fetch the schema; the `$id` of the document. */
export const SCHEMA_ID = 'https://unpkg.com/gicladder/schema.json';

/** The schema document (an object). */
export function designSpecSchemaDocument(): Record<string, unknown> {
  const { $schema, ...rest } = designSpecJsonSchema();
  return { $schema, $id: SCHEMA_ID, title: 'gicladder design file', ...rest };
}

/** The schema as the text of schema.json. */
export function renderDesignSpecJsonSchema(): string {
  return `${JSON.stringify(designSpecSchemaDocument(), null, 2)}\n`;
}
