import { readFileSync } from 'node:fs';

export interface SchemaField {
  name: string;
  column: string;
  type: string;
  optional: boolean;
  list: boolean;
  nativeType?: string;
}
export interface SchemaModel {
  name: string;
  table: string;
  fields: SchemaField[];
}

const SCALARS = new Set(['Int', 'BigInt', 'String', 'Float', 'Decimal', 'Boolean', 'DateTime', 'Json', 'Bytes']);

/**
 * The scalar fields of every model in a Prisma schema file: enough of the
 * grammar to compare against the database (the test cross-checks the field
 * names with the generated client, so a field this reader missed fails).
 */
export function readPrismaModels(file: string): SchemaModel[] {
  const text = readFileSync(file, 'utf8').replace(/\/\/.*$/gm, '');
  const models: SchemaModel[] = [];
  // A model body ends at the first `}` outside a string (defaults such as @default("{}") hold braces).
  for (const match of text.matchAll(/model\s+(\w+)\s*\{((?:"(?:[^"\\]|\\.)*"|[^}"])*)\}/g)) {
    const [, name, body] = match as unknown as [string, string, string];
    const table = /@@map\("([^"]+)"\)/.exec(body)?.[1] ?? name;
    const fields: SchemaField[] = [];
    for (const line of body.split('\n').map((l) => l.trim())) {
      const field = /^(\w+)\s+(\w+)(\[\]|\?)?(.*)$/.exec(line);
      if (!field || line.startsWith('@@')) continue;
      const [, fieldName, type, suffix, rest] = field as unknown as [string, string, string, string | undefined, string];
      if (!SCALARS.has(type)) continue;
      fields.push({
        name: fieldName,
        column: /@map\("([^"]+)"\)/.exec(rest)?.[1] ?? fieldName,
        type,
        optional: suffix === '?',
        list: suffix === '[]',
        nativeType: /@db\.(\w+)/.exec(rest)?.[1],
      });
    }
    models.push({ name, table, fields });
  }
  return models;
}
