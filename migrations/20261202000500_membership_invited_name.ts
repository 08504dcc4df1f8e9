import type { Knex } from 'knex';

// An invitation names the person as the inviting farm typed them. Until they accept, that farm
// sees only that name, never the name an existing account already has (which another farm or
// the person gave), so inviting an address does not tell whether it has an account.
// memberships already has the farm revision trigger (20261202000100_farm_revisions).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('memberships', (t) => {
    t.string('invited_name', 120).nullable().comment('The name the inviting farm typed, shown to that farm until the person accepts');
  });
  // Open invitations from before: a person who never set a password has only ever had a name an
  // inviter typed, so it may stay; anyone else shows by address until they accept.
  await knex.raw(
    `UPDATE memberships m SET invited_name = u.name FROM users u
      WHERE u.id = m.user_id AND m.status = 'invited' AND u.password_hash IS NULL`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('memberships', (t) => {
    t.dropColumn('invited_name');
  });
}
