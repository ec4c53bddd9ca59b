import type { Knex } from 'knex';

/** Designs of a workspace and their numbered, immutable spec versions. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('designs', (t) => {
    t.increments('id').primary();
    t.integer('workspace_id').unsigned().notNullable().references('workspaces.id').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.boolean('archived').notNullable().defaultTo(false);
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['workspace_id', 'archived', 'updated_at']);
  });
  await knex.schema.createTable('design_versions', (t) => {
    t.increments('id').primary();
    t.integer('design_id').unsigned().notNullable().references('designs.id').onDelete('CASCADE');
    t.integer('number').unsigned().notNullable();
    t.json('spec').notNullable();
    t.specificType('spec_hash', 'CHAR(64)').notNullable();
    // review and release move it on: draft → in-review → approved | changes-requested
    t.enum('status', ['draft', 'in-review', 'approved', 'changes-requested']).notNullable().defaultTo('draft');
    t.integer('author_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['design_id', 'number']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('design_versions');
  await knex.schema.dropTableIfExists('designs');
}
