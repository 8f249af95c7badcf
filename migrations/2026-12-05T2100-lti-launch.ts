import { sql, type Kysely } from 'kysely';

/**
 * Launches from a learning platform: the platforms the admin registers (each bound to one course) and
 * their deployments; our own signing keys; the login states of launches under way (single use,
 * short-lived); the people who came by a launch, keyed by the platform's subject id; the resource
 * links an instructor has placed on an assignment and section; and the one-time tickets that carry a
 * verified launch over to a same-site request, where the session cookie is set.
 */
export async function up(db: Kysely<unknown>): Promise<void> {
  await db.schema
    .createTable('lti_platforms')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('course_id', 'integer', (c) => c.notNull().references('courses.id'))
    .addColumn('issuer', 'text', (c) => c.notNull())
    .addColumn('client_id', 'text', (c) => c.notNull())
    .addColumn('auth_url', 'text', (c) => c.notNull())
    .addColumn('token_url', 'text', (c) => c.notNull())
    .addColumn('jwks_url', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('lti_platforms_issuer_client', ['issuer', 'client_id'])
    .execute();

  await db.schema
    .createTable('lti_deployments')
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('deployment_id', 'text', (c) => c.notNull())
    .addPrimaryKeyConstraint('lti_deployments_pkey', ['platform_id', 'deployment_id'])
    .execute();

  await db.schema
    .createTable('lti_keys')
    .addColumn('kid', 'text', (c) => c.primaryKey())
    .addColumn('public_jwk', 'text', (c) => c.notNull())
    .addColumn('private_jwk', 'text', (c) => c.notNull())
    .addColumn('created_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addColumn('retired_at', 'timestamptz')
    .execute();
  // One key signs at a time: a second rotation at the same moment fails rather than leave two.
  await sql`CREATE UNIQUE INDEX lti_keys_one_signing ON lti_keys ((true)) WHERE retired_at IS NULL`.execute(db);

  await db.schema
    .createTable('lti_login_states')
    .addColumn('state_hash', 'text', (c) => c.primaryKey())
    .addColumn('nonce', 'text', (c) => c.notNull().unique())
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addColumn('used_at', 'timestamptz')
    .execute();

  await db.schema
    .createTable('lti_users')
    .addColumn('id', 'serial', (c) => c.primaryKey())
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('sub', 'text', (c) => c.notNull())
    .addColumn('display_name', 'text')
    .addColumn('roles', 'text', (c) => c.notNull())
    .addColumn('student_row_id', 'integer', (c) => c.references('students.id'))
    .addColumn('staff_id', 'integer', (c) => c.references('staff.id'))
    .addColumn('first_launch_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addUniqueConstraint('lti_users_platform_sub', ['platform_id', 'sub'])
    .execute();

  await db.schema
    .createTable('lti_placements')
    .addColumn('platform_id', 'integer', (c) => c.notNull().references('lti_platforms.id'))
    .addColumn('context_id', 'text', (c) => c.notNull())
    .addColumn('resource_link_id', 'text', (c) => c.notNull())
    .addColumn('assignment_id', 'integer', (c) => c.notNull().references('assignments.id'))
    .addColumn('section_id', 'integer', (c) => c.notNull().references('sections.id'))
    .addColumn('placed_by', 'integer', (c) => c.references('staff.id'))
    .addColumn('placed_at', 'timestamptz', (c) => c.notNull().defaultTo(sql`now()`))
    .addPrimaryKeyConstraint('lti_placements_pkey', ['platform_id', 'context_id', 'resource_link_id'])
    .execute();

  await db.schema
    .createTable('lti_tickets')
    .addColumn('ticket_hash', 'text', (c) => c.primaryKey())
    .addColumn('student_row_id', 'integer', (c) => c.references('students.id'))
    .addColumn('staff_id', 'integer', (c) => c.references('staff.id'))
    .addColumn('expires_at', 'timestamptz', (c) => c.notNull())
    .addCheckConstraint('lti_tickets_one_person', sql`(student_row_id IS NULL) <> (staff_id IS NULL)`)
    .execute();
}

export async function down(db: Kysely<unknown>): Promise<void> {
  for (const table of ['lti_tickets', 'lti_placements', 'lti_users', 'lti_login_states', 'lti_keys', 'lti_deployments', 'lti_platforms']) {
    await db.schema.dropTable(table).execute();
  }
}
