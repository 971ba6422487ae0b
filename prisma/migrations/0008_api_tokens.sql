-- Bearer tokens of the JSON API (api-v1), created by `holdfast token create`.
--
-- Only the SHA-256 of a token is stored, never the token. A plain, unsalted
-- hash is enough here (a slow password hash such as scrypt is not needed):
-- tokens are 32 random bytes, so there is no dictionary to try and a brute
-- force over 2^256 values is out of reach; a fast hash also lets every API
-- request find its token through the unique index below in one lookup.
CREATE TABLE api_token (
  id            serial PRIMARY KEY,
  name          text NOT NULL CHECK (length(name) BETWEEN 1 AND 100),
  role          text NOT NULL CHECK (role IN ('admin', 'fleet_manager', 'shore_engineer', 'charterer')),
  -- A charterer token is scoped to one campaign, and only a charterer token
  -- is. Deleting the campaign deletes its tokens: a scoped token must never
  -- outlive its scope and turn into an unscoped one.
  campaign_id   integer REFERENCES campaign (id) ON DELETE CASCADE,
  token_hash    text NOT NULL UNIQUE CHECK (token_hash ~ '^[0-9a-f]{64}$'),
  created_at    timestamptz NOT NULL DEFAULT now(),
  -- Updated at most once a minute per token (lib/api/auth.ts), so reading
  -- the API does not write a row per request.
  last_used_at  timestamptz,
  -- Set to revoke; a revoked token is refused (401) and kept for the record.
  revoked_at    timestamptz,
  CHECK ((role = 'charterer') = (campaign_id IS NOT NULL))
);
