import type { Knex } from 'knex';

// Every server process keeps a read session for a few seconds (server/http/session.ts). When a
// session is deleted (sign-out) or its content changes (sign-in on the same cookie), PostgreSQL
// tells every process at once on the channel `furlong_session`, with the session id, so none
// goes on using its kept copy. Expired sessions pruned later need no word.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE FUNCTION furlong_session_changed() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM pg_notify('furlong_session', OLD.sid);
      RETURN NULL;
    END $$;
    COMMENT ON FUNCTION furlong_session_changed() IS 'Tells every server process that a session was signed out or changed';
    CREATE TRIGGER session_deleted AFTER DELETE ON session
      FOR EACH ROW WHEN (OLD.expire > now()) EXECUTE FUNCTION furlong_session_changed();
    CREATE TRIGGER session_changed AFTER UPDATE OF sess ON session
      FOR EACH ROW WHEN (OLD.sess::text IS DISTINCT FROM NEW.sess::text) EXECUTE FUNCTION furlong_session_changed();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER session_changed ON session;
    DROP TRIGGER session_deleted ON session;
    DROP FUNCTION furlong_session_changed();
  `);
}
