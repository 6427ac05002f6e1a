import type { MigrationInterface, QueryRunner } from 'typeorm';

/** What sign-in records about a person: their GitHub id and when they last signed in. */
export class AddUserSignIn1764633600002 implements MigrationInterface {
  name = 'AddUserSignIn1764633600002';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE users
        ADD COLUMN githubId VARCHAR(40) NULL AFTER disabled,
        ADD COLUMN lastSignInAt DATETIME(3) NULL AFTER githubId,
        ADD UNIQUE KEY uq_users_github_id (githubId)
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE users DROP INDEX uq_users_github_id, DROP COLUMN lastSignInAt, DROP COLUMN githubId');
  }
}
