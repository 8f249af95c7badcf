import { Migrator, sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { migrations } from '../../migrations/index.ts';
import { openStore } from '../../server/store/connection.ts';
import { migrateToLatest } from '../../server/store/migrate.ts';

/**
 * Results released before releases were kept: the migration makes each submission's latest released
 * result its release, with the overrides made so far (those were shown at once then), and no release
 * where nothing was released. The rows are written by hand here, in the tables as they were.
 */
describe('the releases migration', () => {
  it('turns released results into releases, leaving unreleased submissions unreleased', async () => {
    const store = openStore({ dataDir: 'memory://' });
    try {
      const db = store.db;
      const migrator = new Migrator({ db, provider: { getMigrations: async () => migrations } });
      const { error } = await migrator.migrateTo('2026-12-02T2330-signal-choices');
      expect(error).toBeUndefined();
      await sql`INSERT INTO courses (name) VALUES ('c')`.execute(db);
      await sql`INSERT INTO sections (course_id, name) VALUES (1, 'A')`.execute(db);
      await sql`INSERT INTO staff (course_id, handle, role) VALUES (1, 'ta-a', 'ta')`.execute(db);
      await sql`INSERT INTO students (course_id, section_id, student_id) VALUES (1, 1, 'S-1'), (1, 1, 'S-2')`.execute(db);
      await sql`INSERT INTO assignments (course_id, title, kind, settings) VALUES (1, 't', 'first-order-catalysis', '{}')`.execute(db);
      await sql`INSERT INTO submissions (assignment_id, student_row_id, version, payload) VALUES (1, 1, 1, '{}'), (1, 2, 1, '{}')`.execute(db);
      const result = (submission: number, score: number, released: boolean) =>
        sql`INSERT INTO results (submission_id, engine_version, settings_version, settings, status, score, max_score, findings, released_at, released_by)
            VALUES (${submission}, 'v', 1, '{}', 'checked', ${score}, 22, '{"findings":[]}', ${released ? sql`now()` : null}, ${released ? 1 : null})`.execute(db);
      // S-1: released, then regraded (the regrade's result unreleased); S-2: never released.
      await result(1, 20, true);
      await result(1, 21, false);
      await result(2, 18, false);
      await sql`INSERT INTO overrides (submission_id, finding_id, points_before, points_after, reason, staff_id) VALUES (1, 'x@y', 2, 1, 'r', 1)`.execute(db);

      await migrateToLatest(db);
      const rows = await sql<{ submission_id: number; result_id: number; overrides_through: number; choices_through: number; released_by: number }>`
        SELECT submission_id, result_id, overrides_through, choices_through, released_by FROM releases ORDER BY submission_id`.execute(db);
      expect(rows.rows).toEqual([{ submission_id: 1, result_id: 1, overrides_through: 1, choices_through: 0, released_by: 1 }]);
    } finally {
      await store.close();
    }
  });
});
