import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Users, studios, memberships, invitations, password resets, the mail outbox and sessions.
 * Constraint names are the ones TypeORM derives from the entities, so the schema check in the
 * API tests (`createSchemaBuilder().log()` finds nothing to change) stays meaningful.
 */
export class InitialSchema1764633600000 implements MigrationInterface {
  name = 'InitialSchema1764633600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(
      `CREATE TABLE "users" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "email" varchar(254) NOT NULL, "name" varchar(120) NOT NULL, "password_hash" varchar(100) NOT NULL, "global_role" varchar(20), "created_at" datetime NOT NULL, "last_login_at" datetime, CONSTRAINT "UQ_97672ac88f789774dd47f7c8be3" UNIQUE ("email"))`,
    );
    await q.query(
      `CREATE TABLE "studios" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "name" varchar(120) NOT NULL, "description" text NOT NULL DEFAULT (''), "created_at" datetime NOT NULL, CONSTRAINT "UQ_24cf90ec8130204b259c7ec9b6b" UNIQUE ("name"))`,
    );
    await q.query(
      `CREATE TABLE "memberships" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "user_id" integer NOT NULL, "studio_id" integer NOT NULL, "role" varchar(20) NOT NULL, "created_at" datetime NOT NULL, CONSTRAINT "FK_7c1e2fdfed4f6838e0c05ae5051" FOREIGN KEY ("user_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_c48cdcf070971eff772b634b849" FOREIGN KEY ("studio_id") REFERENCES "studios" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_memberships_studio" ON "memberships" ("studio_id") `);
    await q.query(`CREATE UNIQUE INDEX "uq_memberships_user_studio" ON "memberships" ("user_id", "studio_id") `);
    await q.query(
      `CREATE TABLE "invitations" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "studio_id" integer NOT NULL, "email" varchar(254) NOT NULL, "role" varchar(20) NOT NULL, "token_hash" varchar(64) NOT NULL, "invited_by_id" integer, "created_at" datetime NOT NULL, "expires_at" datetime NOT NULL, "accepted_at" datetime, "accepted_by_id" integer, "revoked_at" datetime, CONSTRAINT "UQ_872ac94a64b3d44fc4b554780cd" UNIQUE ("token_hash"), CONSTRAINT "FK_a5de8b19420f32b59a47c69e84b" FOREIGN KEY ("studio_id") REFERENCES "studios" ("id") ON DELETE CASCADE ON UPDATE NO ACTION, CONSTRAINT "FK_d4de0403dd012cf87b430af70ef" FOREIGN KEY ("invited_by_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION, CONSTRAINT "FK_669fdec7c1734fcfb4043042899" FOREIGN KEY ("accepted_by_id") REFERENCES "users" ("id") ON DELETE SET NULL ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_invitations_studio" ON "invitations" ("studio_id") `);
    await q.query(
      `CREATE TABLE "password_resets" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "user_id" integer NOT NULL, "token_hash" varchar(64) NOT NULL, "created_at" datetime NOT NULL, "expires_at" datetime NOT NULL, "used_at" datetime, CONSTRAINT "UQ_323290a9239ad3d397ad78018ec" UNIQUE ("token_hash"), CONSTRAINT "FK_f7a4c3bc48f24df007936d217be" FOREIGN KEY ("user_id") REFERENCES "users" ("id") ON DELETE CASCADE ON UPDATE NO ACTION)`,
    );
    await q.query(`CREATE INDEX "ix_password_resets_user" ON "password_resets" ("user_id") `);
    await q.query(
      `CREATE TABLE "mail_messages" ("id" integer PRIMARY KEY AUTOINCREMENT NOT NULL, "from_address" varchar(500) NOT NULL, "to_address" varchar(2000) NOT NULL, "subject" varchar(1000) NOT NULL, "text_body" text NOT NULL, "html_body" text, "raw_size" integer NOT NULL, "received_at" datetime NOT NULL)`,
    );
    await q.query(
      `CREATE TABLE "sessions" ("expired_at" bigint NOT NULL, "id" varchar(255) PRIMARY KEY NOT NULL, "json" text NOT NULL, "destroyed_at" datetime)`,
    );
    await q.query(`CREATE INDEX "ix_sessions_expired_at" ON "sessions" ("expired_at") `);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP INDEX "ix_sessions_expired_at"`);
    await q.query(`DROP TABLE "sessions"`);
    await q.query(`DROP TABLE "mail_messages"`);
    await q.query(`DROP INDEX "ix_password_resets_user"`);
    await q.query(`DROP TABLE "password_resets"`);
    await q.query(`DROP INDEX "ix_invitations_studio"`);
    await q.query(`DROP TABLE "invitations"`);
    await q.query(`DROP INDEX "uq_memberships_user_studio"`);
    await q.query(`DROP INDEX "ix_memberships_studio"`);
    await q.query(`DROP TABLE "memberships"`);
    await q.query(`DROP TABLE "studios"`);
    await q.query(`DROP TABLE "users"`);
  }
}
