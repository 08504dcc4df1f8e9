/**
 * A member's name as their farm may see it (members `m` joined to users `u`): until an invitation is
 * accepted, the name the farm typed (or the address), never the name of an account the person may
 * already have elsewhere.
 */
export const MEMBER_NAME_SQL = "CASE WHEN m.status = 'invited' THEN coalesce(m.invited_name, u.email) ELSE u.name END";
