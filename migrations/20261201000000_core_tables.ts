import type { Knex } from 'knex';

/**
 * The core of Brimwatch's data: who (teams, users), what is watched (services,
 * sketches and their targets, one per instance), what was seen (readings, a
 * time series partitioned by time), what was said (alerts) and who changed
 * what (audit log). Later migrations extend these.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('teams', (t) => {
    t.bigIncrements('id');
    t.text('slug').notNullable().unique();
    t.text('name').notNullable();
    t.text('alert_email');
    t.text('escalation_email');
    t.timestamps(true, true);
  });

  await knex.schema.createTable('users', (t) => {
    t.bigIncrements('id');
    t.text('login').notNullable().unique();
    t.text('subject').unique(); // the provider's `sub`, set on first sign-in
    t.text('name').notNullable();
    t.text('email');
    t.text('role').notNullable().defaultTo('viewer');
    t.timestamp('last_sign_in_at', { useTz: true });
    t.timestamps(true, true);
  });
  await knex.raw(`alter table users add constraint users_role_known check (role in ('viewer','responder','owner','sre','admin'))`);

  await knex.schema.createTable('team_members', (t) => {
    t.bigInteger('team_id').notNullable().references('teams.id').onDelete('CASCADE');
    t.bigInteger('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.boolean('wants_alert_mail').notNullable().defaultTo(false);
    t.primary(['team_id', 'user_id']);
  });

  await knex.schema.createTable('services', (t) => {
    t.bigIncrements('id');
    t.bigInteger('team_id').notNullable().references('teams.id');
    t.text('name').notNullable().unique();
    t.text('description');
    t.timestamps(true, true);
  });

  await knex.schema.createTable('sketches', (t) => {
    t.bigIncrements('id');
    t.bigInteger('service_id').notNullable().references('services.id');
    t.bigInteger('team_id').notNullable().references('teams.id');
    t.text('name').notNullable(); // the `sketch` label in the service's exposition
    t.double('error_budget').notNullable();
    t.double('confidence').notNullable();
    t.double('watch_line').notNullable().defaultTo(0.8);
    t.double('lead_time_days').notNullable().defaultTo(7);
    t.integer('scrape_interval_seconds').notNullable().defaultTo(30);
    t.double('sized_total');
    t.timestamps(true, true);
    t.unique(['service_id', 'name']);
  });
  await knex.raw(`alter table sketches add constraint sketches_figures_sane check (
    error_budget > 0 and confidence > 0 and confidence < 1 and watch_line > 0 and watch_line <= 1
    and lead_time_days >= 0 and scrape_interval_seconds >= 5 and (sized_total is null or sized_total > 0))`);

  // One target per instance (replica) of the service that carries the sketch.
  await knex.schema.createTable('targets', (t) => {
    t.bigIncrements('id');
    t.bigInteger('sketch_id').notNullable().references('sketches.id').onDelete('CASCADE');
    t.text('url').notNullable();
    t.text('instance').notNullable();
    t.timestamp('next_scrape_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('lease_owner');
    t.timestamp('lease_expires_at', { useTz: true });
    t.timestamps(true, true);
    t.unique(['sketch_id', 'instance']);
  });
  await knex.raw('create index targets_due on targets (next_scrape_at)');

  // Readings grow without end: range-partitioned by time so retention drops whole partitions.
  await knex.raw(`create table readings (
    id bigint generated always as identity,
    target_id bigint not null,
    sketch_id bigint not null,
    taken_at timestamptz not null,
    ok boolean not null,
    failure_reason text,
    stream_total double precision,
    width integer,
    depth integer,
    counter_bytes smallint,
    window_seconds integer,
    conservative boolean,
    nonzero_cells integer[],
    scrape_ms real,
    is_reset boolean not null default false,
    is_resize boolean not null default false,
    judgement jsonb,
    primary key (sketch_id, taken_at, id),
    constraint readings_failure_has_reason check (ok or failure_reason is not null),
    constraint readings_success_has_figures check (not ok or (stream_total >= 0 and width > 0 and depth > 0))
  ) partition by range (taken_at)`);
  await knex.raw('create table readings_default partition of readings default');
  await knex.raw('create index readings_target_time on readings (target_id, taken_at desc)');

  await knex.schema.createTable('alerts', (t) => {
    t.bigIncrements('id');
    t.bigInteger('sketch_id').notNullable().references('sketches.id').onDelete('CASCADE');
    t.text('state').notNullable().defaultTo('open');
    t.text('level').notNullable();
    t.timestamp('opened_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('acknowledged_at', { useTz: true });
    t.bigInteger('acknowledged_by').references('users.id');
    t.text('acknowledge_note');
    t.timestamp('resolved_at', { useTz: true });
    t.timestamp('last_notified_at', { useTz: true });
  });
  await knex.raw(`alter table alerts add constraint alerts_state_known check (state in ('open','acknowledged','resolved'))`);
  await knex.raw(`create unique index alerts_one_live_per_sketch on alerts (sketch_id) where state <> 'resolved'`);

  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.bigInteger('actor_user_id').references('users.id').onDelete('SET NULL');
    t.text('actor').notNullable(); // a login, "token:<label>" or "system"
    t.text('action').notNullable();
    t.text('subject_type').notNullable();
    t.text('subject_id');
    t.jsonb('before');
    t.jsonb('after');
  });
  await knex.raw('create index audit_log_at on audit_log (at desc)');

  await knex.schema.createTable('collector_heartbeats', (t) => {
    t.text('collector_id').primary();
    t.text('host').notNullable();
    t.integer('pid').notNullable();
    t.timestamp('started_at', { useTz: true }).notNullable();
    t.timestamp('beat_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['collector_heartbeats', 'audit_log', 'alerts', 'readings', 'targets', 'sketches', 'services', 'team_members', 'users', 'teams']) {
    await knex.schema.dropTableIfExists(table);
  }
}
