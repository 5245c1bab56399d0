import type { Knex } from 'knex';

// Mail delivered by the local fake transport when no SMTP server is configured (MW_SMTP_URL
// unset): one row per message, shown to admins in the Outbox screen.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (t) => {
    t.increments('id').primary();
    t.string('message_id', 191).nullable();
    t.string('from_address', 191).notNullable();
    t.text('to_addresses').notNullable(); // comma-separated, as the envelope had them
    t.string('subject', 500).notNullable();
    t.text('text', 'mediumtext').notNullable();
    t.integer('related_sheet_id').unsigned().nullable().references('id').inTable('sheets');
    t.string('kind', 64).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['created_at'], 'outbox_created_index');
    t.index(['related_sheet_id'], 'outbox_sheet_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox');
}
