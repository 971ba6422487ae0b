-- Trend flags, part 2 (issue 6): what the flag job needs beside the flag
-- table of 0007 — the evidence behind each flag, close proposals, the job's
-- settings, webhook subscriptions, and the outbox that delivers each new
-- flag to every webhook.

-- The figures behind a flag as the job computed them when it opened
-- (Mann–Kendall S, Var(S), p; Sen's slope and its interval; EWMA, target,
-- limits), for the web app and the API to show beside the explanation.
ALTER TABLE flag ADD COLUMN evidence jsonb NOT NULL DEFAULT '{}';
-- Set when the condition has not held for the configured number of
-- evaluated days: the job proposes closing, a person decides. Cleared if the
-- condition comes back.
ALTER TABLE flag ADD COLUMN close_proposed_day date;

-- The job's settings as one JSON object (lib/flags/config.ts: anything left
-- out takes its default). A single row, so every job process evaluates with
-- the same numbers.
CREATE TABLE flag_settings (
  id          smallint PRIMARY KEY DEFAULT 1 CHECK (id = 1),
  settings    jsonb NOT NULL DEFAULT '{}' CHECK (jsonb_typeof(settings) = 'object'),
  updated_at  timestamptz NOT NULL DEFAULT now()
);

-- Where new flags are sent (HTTP POST of a JSON body).
CREATE TABLE flag_webhook (
  id          serial PRIMARY KEY,
  url         text NOT NULL UNIQUE CHECK (url ~ '^https?://'),
  -- When set, each delivery carries an HMAC-SHA256 of its body under this key.
  secret      text,
  enabled     boolean NOT NULL DEFAULT true,
  created_at  timestamptz NOT NULL DEFAULT now()
);

-- One row per (new flag, webhook), written in the transaction that opens the
-- flag, so a flag is never stored without its deliveries nor delivered
-- without being stored. Rows are kept after delivery as the record of it.
CREATE TABLE flag_outbox (
  id               bigserial PRIMARY KEY,
  flag_id          bigint NOT NULL REFERENCES flag (id) ON DELETE CASCADE,
  webhook_id       integer NOT NULL REFERENCES flag_webhook (id) ON DELETE CASCADE,
  payload          jsonb NOT NULL,
  attempts         integer NOT NULL DEFAULT 0,
  -- Also the lease: a sender moves it forward before trying, so a sender
  -- that dies mid-request leaves the row to be retried when the lease ends.
  next_attempt_at  timestamptz NOT NULL DEFAULT now(),
  delivered_at     timestamptz,
  last_error       text,
  created_at       timestamptz NOT NULL DEFAULT now(),
  UNIQUE (flag_id, webhook_id)
);

CREATE INDEX flag_outbox_due_idx ON flag_outbox (next_attempt_at) WHERE delivered_at IS NULL;
