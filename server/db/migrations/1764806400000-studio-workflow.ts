import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The studio workflow: the material catalogue, briefs and their changelog, submissions,
 * numbered revisions, the content-addressed blob store's records and revision files, audits,
 * critic assignments, notification settings and the log that keeps each e-mail to one send.
 * Constraint names are the ones TypeORM derives from the entities (see the initial schema).
 */
export class StudioWorkflow1764806400000 implements MigrationInterface {
  name = 'StudioWorkflow1764806400000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE "materials" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "name" varchar(120) NOT NULL, "thickness" real NOT NULL, "kerf" real NOT NULL, "cutting_speed" real, "density" real, "sheet_sizes" text NOT NULL, "prohibited" boolean NOT NULL DEFAULT (0), "prohibited_reason" text, "notes" text NOT NULL DEFAULT (''), "created_at" datetime NOT NULL, "updated_at" datetime NOT NULL, CONSTRAINT "UQ_9b614bb357c5d8741a1a381385c" UNIQUE ("name"))`,
    );
    await q.query(
      `CREATE TABLE "blobs" ("sha256" varchar(64) PRIMARY KEY NOT NULL, "size" integer NOT NULL, "media_type" varchar(100) NOT NULL, "created_at" datetime NOT NULL)`,
    );
    await q.query(
      `CREATE TABLE "briefs" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "studio_id" integer NOT NULL, "title" varchar(200) NOT NULL, "body" text NOT NULL, "constraints" text NOT NULL, "material_id" integer NOT NULL, "deadline" datetime NOT NULL, "late_policy" varchar(30) NOT NULL, "critique_opens_at" datetime, "critique_closes_at" datetime, "rubric" text NOT NULL, "state" varchar(20) NOT NULL, "gallery_open" boolean NOT NULL DEFAULT (0), "created_by_id" integer, "created_at" datetime NOT NULL, "updated_at" datetime NOT NULL, "published_at" datetime, "closed_at" datetime, CONSTRAINT "FK_5dd8737d05da411be5725e68704" FOREIGN KEY ("studio_id") REFERENCES "studios" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_d814e6cecd04f8745f14bb499c3" FOREIGN KEY ("material_id") REFERENCES "materials" ("id") ON DELETE RESTRICT ON UPDATE NO ACTION, CONSTRAINT "FK_97e4e4dc84655ac23025d9244a7" FOREIGN KEY ("created_by_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_briefs_studio" ON "briefs" ("studio_id")`);
    await q.query(
      `CREATE TABLE "brief_changes" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "brief_id" integer NOT NULL, "user_id" integer, "user_name" varchar(120) NOT NULL, "at" datetime NOT NULL, "summary" text NOT NULL, "details" text NOT NULL, "reaudited" integer NOT NULL DEFAULT (0), CONSTRAINT "FK_c134f81f36ed9dba1138f351d2c" FOREIGN KEY ("brief_id") REFERENCES "briefs" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_9cf0a17d1e867b38be9d08ee76c" FOREIGN KEY ("user_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_brief_changes_brief" ON "brief_changes" ("brief_id")`);
    await q.query(
      `CREATE TABLE "notification_settings" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "user_id" integer NOT NULL, "kind" varchar(40) NOT NULL, "enabled" boolean NOT NULL, CONSTRAINT "FK_91a7ffebe8b406c4470845d4781" FOREIGN KEY ("user_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(
      `CREATE UNIQUE INDEX "uq_notification_settings_user_kind" ON "notification_settings" ("user_id", "kind")`,
    );
    await q.query(
      `CREATE TABLE "notification_log" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "kind" varchar(40) NOT NULL, "user_id" integer NOT NULL, "subject_id" integer NOT NULL, "sent_at" datetime NOT NULL, CONSTRAINT "FK_2318594e750647311b24da4ae5f" FOREIGN KEY ("user_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(
      `CREATE UNIQUE INDEX "uq_notification_log_kind_user_subject" ON "notification_log" ("kind", "user_id", "subject_id")`,
    );
    await q.query(
      `CREATE TABLE "submissions" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "brief_id" integer NOT NULL, "participant_id" integer NOT NULL, "created_at" datetime NOT NULL, CONSTRAINT "FK_268a228a3dbdaf1de856d3e6f23" FOREIGN KEY ("brief_id") REFERENCES "briefs" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_6a4e4d77ba758803a18b44f1a8b" FOREIGN KEY ("participant_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(
      `CREATE UNIQUE INDEX "uq_submissions_brief_participant" ON "submissions" ("brief_id", "participant_id")`,
    );
    await q.query(
      `CREATE TABLE "revisions" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "submission_id" integer NOT NULL, "number" integer NOT NULL, "title" varchar(200) NOT NULL, "design" text NOT NULL, "source" varchar(10) NOT NULL, "late" boolean NOT NULL DEFAULT (0), "created_at" datetime NOT NULL, CONSTRAINT "FK_5aac4b8e3d5c3e7ba52a95254ad" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(
      `CREATE UNIQUE INDEX "uq_revisions_submission_number" ON "revisions" ("submission_id", "number")`,
    );
    await q.query(
      `CREATE TABLE "revision_files" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "revision_id" integer NOT NULL, "blob_sha256" varchar(64) NOT NULL, "role" varchar(20) NOT NULL, "original_name" varchar(255) NOT NULL, CONSTRAINT "FK_935be42d59948c26155308e3f47" FOREIGN KEY ("revision_id") REFERENCES "revisions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_abdd9f15286ee5bcfaaceee8197" FOREIGN KEY ("blob_sha256") REFERENCES "blobs" ("sha256") ON DELETE RESTRICT ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_revision_files_revision" ON "revision_files" ("revision_id")`);
    await q.query(
      `CREATE TABLE "audits" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "revision_id" integer NOT NULL, "state" varchar(20) NOT NULL, "report" text, "figures" text, "errors" integer, "warnings" integer, "error" text, "attempts" integer NOT NULL DEFAULT (0), "queued_at" datetime NOT NULL, "started_at" datetime, "finished_at" datetime, CONSTRAINT "UQ_4d15b8c36aea33ce5760d5e13a7" UNIQUE ("revision_id"), CONSTRAINT "FK_4d15b8c36aea33ce5760d5e13a7" FOREIGN KEY ("revision_id") REFERENCES "revisions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_audits_state" ON "audits" ("state")`);
    await q.query(
      `CREATE TABLE "critic_assignments" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "submission_id" integer NOT NULL, "critic_id" integer NOT NULL, "assigned_at" datetime NOT NULL, CONSTRAINT "FK_dd582701f91a8a35fc8796f814a" FOREIGN KEY ("submission_id") REFERENCES "submissions" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_ff5559597908c5fdd94be7c9384" FOREIGN KEY ("critic_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_critic_assignments_critic" ON "critic_assignments" ("critic_id")`);
    await q.query(
      `CREATE UNIQUE INDEX "uq_critic_assignments_submission_critic" ON "critic_assignments" ("submission_id", "critic_id")`,
    );
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "uq_critic_assignments_submission_critic"`);
    await q.query(`DROP INDEX "ix_critic_assignments_critic"`);
    await q.query(`DROP TABLE "critic_assignments"`);
    await q.query(`DROP INDEX "ix_audits_state"`);
    await q.query(`DROP TABLE "audits"`);
    await q.query(`DROP INDEX "ix_revision_files_revision"`);
    await q.query(`DROP TABLE "revision_files"`);
    await q.query(`DROP INDEX "uq_revisions_submission_number"`);
    await q.query(`DROP TABLE "revisions"`);
    await q.query(`DROP INDEX "uq_submissions_brief_participant"`);
    await q.query(`DROP TABLE "submissions"`);
    await q.query(`DROP INDEX "uq_notification_log_kind_user_subject"`);
    await q.query(`DROP TABLE "notification_log"`);
    await q.query(`DROP INDEX "uq_notification_settings_user_kind"`);
    await q.query(`DROP TABLE "notification_settings"`);
    await q.query(`DROP INDEX "ix_brief_changes_brief"`);
    await q.query(`DROP TABLE "brief_changes"`);
    await q.query(`DROP INDEX "ix_briefs_studio"`);
    await q.query(`DROP TABLE "briefs"`);
    await q.query(`DROP TABLE "blobs"`);
    await q.query(`DROP TABLE "materials"`);
  }
}
