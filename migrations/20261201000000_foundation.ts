import type { Knex } from 'knex';

/** Users, workspaces with role memberships, shared sessions, rate-limit counters, audit. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.string('email', 254).notNullable().unique();
    t.string('name', 120).notNullable();
    t.string('password_hash', 100).notNullable();
    t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('workspaces', (t) => {
    t.increments('id').primary();
    t.string('slug', 64).notNullable().unique();
    t.string('name', 120).notNullable();
    t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('memberships', (t) => {
    t.integer('workspace_id').unsigned().notNullable().references('workspaces.id').onDelete('CASCADE');
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE');
    t.enum('role', ['owner', 'engineer', 'reviewer', 'viewer']).notNullable();
    t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
    t.primary(['workspace_id', 'user_id']);
  });
  // express-session store (connect-session-knex), its own table name (see STACK.md)
  await knex.schema.createTable('auth_sessions', (t) => {
    t.string('sid', 255).primary();
    t.json('sess').notNullable();
    t.dateTime('expired').notNullable().index();
  });
  // shared counters for express-rate-limit, so every server process sees the same limits
  await knex.schema.createTable('rate_limit_hits', (t) => {
    t.string('key', 255).primary();
    t.integer('hits').notNullable();
    t.dateTime('reset_at', { precision: 3 }).notNullable().index();
  });
  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id').primary();
    t.integer('workspace_id').unsigned().nullable().references('workspaces.id').onDelete('SET NULL');
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL');
    t.string('action', 64).notNullable();
    t.string('subject', 255).notNullable().defaultTo('');
    t.json('detail').nullable();
    t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['workspace_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ['audit_events', 'rate_limit_hits', 'auth_sessions', 'memberships', 'workspaces', 'users']) {
    await knex.schema.dropTableIfExists(t);
  }
}
