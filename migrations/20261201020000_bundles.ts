import type { Knex } from 'knex';

/** Generated code bundles (one per design version, bytes kept) and their download history. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bundles', (t) => {
    t.increments('id').primary();
    t.integer('design_version_id').unsigned().notNullable().unique().references('design_versions.id').onDelete('CASCADE');
    t.specificType('sha256', 'CHAR(64)').notNullable();
    t.string('file_name', 80).notNullable();
    t.integer('size_bytes').unsigned().notNullable();
    t.specificType('zip', 'LONGBLOB').notNullable();
    // the same files as text, for the preview without unpacking the zip
    t.specificType('files', 'LONGTEXT').notNullable();
    t.string('generator_version', 32).notNullable();
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
  await knex.schema.createTable('downloads', (t) => {
    t.bigIncrements('id').primary();
    t.integer('bundle_id').unsigned().notNullable().references('bundles.id').onDelete('CASCADE');
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('client', 64).notNullable().defaultTo('');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['bundle_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('downloads');
  await knex.schema.dropTableIfExists('bundles');
}
