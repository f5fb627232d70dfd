import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The critique: pins on a submission's model with their anchor on each revision and their
 * threads, pin-up sessions and their running order, critics' score sheets and the instructor's
 * final mark and release. Constraint names are the ones TypeORM derives from the entities.
 */
export class Critique1765065600000 implements MigrationInterface {
  name = 'Critique1765065600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE "pins" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "submission_id" integer NOT NULL, "number" integer NOT NULL, "placed_on_revision_id" integer NOT NULL, "scope" varchar(10) NOT NULL, "category" varchar(20) NOT NULL, "state" varchar(10) NOT NULL, "camera" text NOT NULL, "author_id" integer, "resolved_by_id" integer, "outdated_reason" text, "created_at" datetime NOT NULL, "updated_at" datetime NOT NULL, CONSTRAINT "FK_5e3cf4bfa9c47a92149ac81b7b9" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_ac23e55531eedf2ae53e7da7fdc" FOREIGN KEY ("placed_on_revision_id") REFERENCES "revisions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_42d2c5e94e8811c1d3024c51f63" FOREIGN KEY ("author_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_faef2753a812ddbc0ce26876c58" FOREIGN KEY ("resolved_by_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE UNIQUE INDEX "uq_pins_submission_number" ON "pins" ("submission_id", "number")`);
    await q.query(
      `CREATE TABLE "pin_anchors" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "pin_id" integer NOT NULL, "revision_id" integer NOT NULL, "piece" varchar(130) NOT NULL, "x" real NOT NULL, "y" real NOT NULL, "side" integer NOT NULL, CONSTRAINT "FK_c585697806df41b6f9b8b65f71f" FOREIGN KEY ("pin_id") REFERENCES "pins" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_105962c25ff2832727b525b9842" FOREIGN KEY ("revision_id") REFERENCES "revisions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_pin_anchors_revision" ON "pin_anchors" ("revision_id")`);
    await q.query(`CREATE UNIQUE INDEX "uq_pin_anchors_pin_revision" ON "pin_anchors" ("pin_id", "revision_id")`);
    await q.query(
      `CREATE TABLE "pin_comments" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "pin_id" integer NOT NULL, "author_id" integer, "body" text NOT NULL, "created_at" datetime NOT NULL, CONSTRAINT "FK_4186da682143c41044201cd0c82" FOREIGN KEY ("pin_id") REFERENCES "pins" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_2518c8551860c153a43aacebc37" FOREIGN KEY ("author_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_pin_comments_pin" ON "pin_comments" ("pin_id")`);
    await q.query(
      `CREATE TABLE "pinups" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "brief_id" integer NOT NULL, "title" varchar(200) NOT NULL, "starts_at" datetime NOT NULL, "duration_minutes" integer NOT NULL, "room" varchar(200) NOT NULL, "state" varchar(20) NOT NULL, "created_by_id" integer, "created_at" datetime NOT NULL, "updated_at" datetime NOT NULL, CONSTRAINT "FK_b69c939042d756c5b7321aac44e" FOREIGN KEY ("brief_id") REFERENCES "briefs" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_6377c0470a7b7e017816c2707c0" FOREIGN KEY ("created_by_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_pinups_brief" ON "pinups" ("brief_id")`);
    await q.query(
      `CREATE TABLE "pinup_entries" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "pinup_id" integer NOT NULL, "submission_id" integer NOT NULL, "position" integer NOT NULL, CONSTRAINT "FK_0b046f95bfcd4efe99411c50800" FOREIGN KEY ("pinup_id") REFERENCES "pinups" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_ad38795746de56bc9db9f0f519b" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE UNIQUE INDEX "uq_pinup_entries_pinup_submission" ON "pinup_entries" ("pinup_id", "submission_id")`);
    await q.query(
      `CREATE TABLE "score_sheets" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "submission_id" integer NOT NULL, "scorer_id" integer NOT NULL, "scores" text NOT NULL, "updated_at" datetime NOT NULL, CONSTRAINT "FK_8a66adbb830a641f0d09c8d9b63" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_695d9e24c40f8250c273927ff33" FOREIGN KEY ("scorer_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE UNIQUE INDEX "uq_score_sheets_submission_scorer" ON "score_sheets" ("submission_id", "scorer_id")`);
    await q.query(
      `CREATE TABLE "feedback" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "submission_id" integer NOT NULL, "final_mark" real, "summary" text NOT NULL, "released_at" datetime, "updated_at" datetime NOT NULL, CONSTRAINT "UQ_b7ce399f9a506c8af4a7e94003c" UNIQUE ("submission_id"), CONSTRAINT "FK_b7ce399f9a506c8af4a7e94003c" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "feedback"`);
    await q.query(`DROP INDEX "uq_score_sheets_submission_scorer"`);
    await q.query(`DROP TABLE "score_sheets"`);
    await q.query(`DROP INDEX "uq_pinup_entries_pinup_submission"`);
    await q.query(`DROP TABLE "pinup_entries"`);
    await q.query(`DROP INDEX "ix_pinups_brief"`);
    await q.query(`DROP TABLE "pinups"`);
    await q.query(`DROP INDEX "ix_pin_comments_pin"`);
    await q.query(`DROP TABLE "pin_comments"`);
    await q.query(`DROP INDEX "uq_pin_anchors_pin_revision"`);
    await q.query(`DROP INDEX "ix_pin_anchors_revision"`);
    await q.query(`DROP TABLE "pin_anchors"`);
    await q.query(`DROP INDEX "uq_pins_submission_number"`);
    await q.query(`DROP TABLE "pins"`);
  }
}
