-- Access control (issue 8): sign-in for the accounts of 0001, sessions,
-- login attempts for rate limiting, the audit log, and MQTT credentials.
-- docs/access-control.md explains every choice; lib/auth and lib/broker hold
-- the code that reads and writes these tables.

-- Users sign in with a password. Only a scrypt hash is kept, in the PHC
-- string format ($scrypt$ln=…,r=…,p=…$salt$hash, lib/auth/password.ts), so
-- the cost parameters travel with each hash and can be raised later. NULL:
-- the user cannot sign in yet. A disabled user keeps its row (the audit log
-- names it) but can no longer sign in, and its sessions are revoked.
ALTER TABLE app_user
  ADD COLUMN password_hash    text CHECK (password_hash ~ '^\$scrypt\$ln=[0-9]+,r=[0-9]+,p=[0-9]+\$[A-Za-z0-9+/]+\$[A-Za-z0-9+/]+$'),
  ADD COLUMN disabled_at      timestamptz,
  ADD COLUMN last_sign_in_at  timestamptz,
  -- A charterer sees its organisation's campaigns only; without one it would
  -- see nothing, which is never what was meant.
  ADD CONSTRAINT app_user_charterer_has_organisation CHECK (role <> 'charterer' OR organisation_id IS NOT NULL);

-- E-mail addresses are compared without case (lib/auth/users.ts stores them
-- lower-cased); this keeps two spellings of one address from being two users.
CREATE UNIQUE INDEX app_user_email_lower_idx ON app_user (lower(email));

-- A signed-in browser. The cookie holds 32 random bytes; the store keeps
-- only their SHA-256 (like api_token: a value that random needs no slow hash,
-- and a stolen table yields no usable cookie). Valid while not revoked,
-- before expires_at (absolute lifetime) and while last_seen_at is recent
-- (idle timeout); lib/auth/sessionPolicy.ts has the durations.
CREATE TABLE user_session (
  id_hash       text PRIMARY KEY CHECK (id_hash ~ '^[0-9a-f]{64}$'),
  user_id       integer NOT NULL REFERENCES app_user (id) ON DELETE CASCADE,
  created_at    timestamptz NOT NULL DEFAULT now(),
  expires_at    timestamptz NOT NULL,
  -- Stamped at most once a minute (lib/auth/sessions.ts), not per request.
  last_seen_at  timestamptz NOT NULL DEFAULT now(),
  revoked_at    timestamptz,
  ip            text CHECK (length(ip) <= 64),
  user_agent    text CHECK (length(user_agent) <= 512),
  CHECK (expires_at > created_at)
);
-- "Sign out everywhere" revokes a user's live sessions.
CREATE INDEX user_session_user_idx ON user_session (user_id) WHERE revoked_at IS NULL;
-- Pruning finds old sessions by their end.
CREATE INDEX user_session_expires_idx ON user_session (expires_at);

-- Every sign-in attempt, for the sliding-window rate limits (per account and
-- per client address, lib/auth/rateLimitPolicy.ts). Kept in the database so
-- that several web processes count the same attempts. `email` is what was
-- typed (lower-cased), whether or not such a user exists. A row starts
-- 'pending' and becomes 'success' or 'failure' once the password is checked;
-- 'limited' marks an attempt refused without a check. Pruned after a day.
CREATE TABLE login_attempt (
  id       bigserial PRIMARY KEY,
  at       timestamptz NOT NULL DEFAULT now(),
  email    text NOT NULL CHECK (length(email) <= 320),
  ip_key   text NOT NULL CHECK (length(ip_key) <= 64),
  outcome  text NOT NULL DEFAULT 'pending' CHECK (outcome IN ('pending', 'success', 'failure', 'limited'))
);
CREATE INDEX login_attempt_email_idx ON login_attempt (email, at DESC);
CREATE INDEX login_attempt_ip_idx ON login_attempt (ip_key, at DESC);

-- Who did what, when: sign-ins, flag steps, register, user, token and
-- credential changes (lib/auth/audit.ts). No foreign keys on purpose: the
-- record must outlive the user, token or vessel it names, so the actor is
-- also written out as text. Rows are never changed (the trigger below);
-- deleting old rows stays possible for a retention policy.
CREATE TABLE audit_log (
  id              bigserial PRIMARY KEY,
  at              timestamptz NOT NULL DEFAULT now(),
  actor_user_id   integer,
  actor_token_id  integer,
  -- Readable actor: an e-mail address, 'token 3', 'cli', 'system'.
  actor           text NOT NULL CHECK (length(actor) BETWEEN 1 AND 320),
  action          text NOT NULL CHECK (action ~ '^[a-z][a-z_]*(\.[a-z][a-z_]*)+$'),
  subject         text CHECK (length(subject) <= 320),
  ip              text CHECK (length(ip) <= 64),
  detail          jsonb NOT NULL DEFAULT '{}'::jsonb
);
CREATE INDEX audit_log_at_idx ON audit_log (at DESC);
CREATE INDEX audit_log_user_idx ON audit_log (actor_user_id, at DESC) WHERE actor_user_id IS NOT NULL;

CREATE FUNCTION holdfast_audit_log_immutable() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'audit_log rows cannot be changed';
END;
$$;
CREATE TRIGGER audit_log_no_update BEFORE UPDATE ON audit_log
  FOR EACH ROW EXECUTE FUNCTION holdfast_audit_log_immutable();

-- MQTT credentials: one per vessel (kind 'vessel', username = the vessel
-- key) and one for the ingest workers (kind 'ingest'). The password hash is
-- Mosquitto's own format (PBKDF2-SHA512, `$7$iterations$salt$hash`), so
-- `holdfast broker export` can write it into a Mosquitto password file as it
-- is, and the embedded broker checks the same hash (lib/broker/passwordHash.ts
-- says why that hash is enough for a generated 256-bit password).
-- Generating new credentials revokes the old ones; revoked rows stay for the
-- record. Deleting the vessel deletes its credentials.
CREATE TABLE mqtt_credential (
  id             serial PRIMARY KEY,
  kind           text NOT NULL CHECK (kind IN ('vessel', 'ingest')),
  vessel_id      integer REFERENCES vessel (id) ON DELETE CASCADE,
  -- Vessel keys have no "_", the ingest username has: they cannot collide.
  username       text NOT NULL CHECK (username ~ '^[A-Za-z0-9_-]{1,64}$'),
  password_hash  text NOT NULL CHECK (password_hash ~ '^\$7\$[0-9]+\$[A-Za-z0-9+/]+=*\$[A-Za-z0-9+/]+=*$'),
  created_at     timestamptz NOT NULL DEFAULT now(),
  revoked_at     timestamptz,
  CHECK ((kind = 'vessel') = (vessel_id IS NOT NULL))
);
-- At most one live credential per username and per vessel.
CREATE UNIQUE INDEX mqtt_credential_live_username_idx ON mqtt_credential (username) WHERE revoked_at IS NULL;
CREATE UNIQUE INDEX mqtt_credential_live_vessel_idx ON mqtt_credential (vessel_id) WHERE revoked_at IS NULL AND vessel_id IS NOT NULL;
