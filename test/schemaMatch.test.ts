import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Prisma } from '../lib/db/generated/client';
import { createPrisma, type PrismaClient } from '../lib/db/prisma';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { readPrismaModels, type SchemaField } from './helpers/prismaSchema';

const models = readPrismaModels(path.resolve('prisma/schema.prisma'));

/** PostgreSQL types a Prisma scalar may map to (PostgreSQL connector docs). */
function compatible(field: SchemaField, column: { data_type: string; udt_name: string }): boolean {
  const element = field.list ? column.udt_name.replace(/^_/, '') : column.udt_name;
  if (field.list && column.data_type !== 'ARRAY') return false;
  const byNative: Record<string, string> = {
    SmallInt: 'int2',
    Timestamptz: 'timestamptz',
    Date: 'date',
  };
  if (field.nativeType) return byNative[field.nativeType] === element;
  const byScalar: Record<string, string> = {
    Int: 'int4',
    BigInt: 'int8',
    String: 'text',
    Float: 'float8',
    Boolean: 'bool',
    DateTime: 'timestamp',
    Json: 'jsonb',
    Bytes: 'bytea',
  };
  return byScalar[field.type] === element;
}

describe('prisma/schema.prisma matches the migrated database', () => {
  let db: TestDatabase;
  let columns: Map<string, { data_type: string; udt_name: string; is_nullable: string }>;
  let prisma: PrismaClient;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const { rows } = await db.pool.query(
      `SELECT table_name, column_name, data_type, udt_name, is_nullable
         FROM information_schema.columns WHERE table_schema = 'public'`,
    );
    columns = new Map(rows.map((r) => [`${r.table_name}.${r.column_name}`, r]));
    prisma = createPrisma(db.url);
  });
  afterAll(async () => {
    await prisma?.$disconnect();
    await db?.drop();
  });

  it('reads the same models and fields as the generated client', () => {
    expect(models.map((m) => m.name).sort()).toEqual(Object.values(Prisma.ModelName).sort());
    // Every scalar field enum the client generated, e.g. Prisma.VesselScalarFieldEnum.
    for (const model of models) {
      const generated = (Prisma as unknown as Record<string, Record<string, string>>)[`${model.name}ScalarFieldEnum`];
      expect(model.fields.map((f) => f.name).sort(), model.name).toEqual(Object.values(generated!).sort());
    }
  });

  it.each(models.map((m) => [m.name, m] as const))('%s: every field is a column of a compatible type', (_, model) => {
    for (const field of model.fields) {
      const column = columns.get(`${model.table}.${field.column}`);
      expect(column, `${model.table}.${field.column} is missing`).toBeDefined();
      expect(compatible(field, column!), `${model.table}.${field.column}: ${field.type} vs ${column!.udt_name}`).toBe(
        true,
      );
      expect(column!.is_nullable === 'YES', `${model.table}.${field.column} nullability`).toBe(field.optional);
    }
  });

  it.each(models.map((m) => [m.name, m] as const))('%s: every column of its table is in the model', (_, model) => {
    const modelled = new Set(model.fields.map((f) => f.column));
    const inTable = [...columns.keys()].filter((k) => k.startsWith(`${model.table}.`)).map((k) => k.split('.')[1]);
    expect(inTable.filter((c) => !modelled.has(c!))).toEqual([]);
  });

  it('writes and reads the register through the client', async () => {
    const vessel = await prisma.vessel.create({
      data: {
        key: 'schema-probe',
        name: 'Schema Probe',
        type: 'supply',
        dpClass: 2,
        watchCirclesM: [3, 5],
        headingLimitsDeg: [2.5, 5],
        thrusters: { create: [{ unitId: 'T1', kind: 'tunnel', ratedKw: 900, serviceIntervalH: 20000 }] },
      },
      include: { thrusters: true },
    });
    expect(vessel.thrusters[0]).toMatchObject({ lifeExponent: 3, wearHAtInstall: 0, diameterM: null });
    const { rows } = await db.pool.query(`SELECT watch_circles_m, heading_limits_deg FROM vessel WHERE key = 'schema-probe'`);
    expect(rows[0]).toEqual({ watch_circles_m: [3, 5], heading_limits_deg: [2.5, 5] });
  });
});
