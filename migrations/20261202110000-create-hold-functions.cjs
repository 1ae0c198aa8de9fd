'use strict';

/**
 * The hold path as three PostgreSQL functions, so each hold, release or sweep is one round trip and no
 * lock is held while the app's event loop is busy elsewhere. Every one takes its locks in the same order
 * (hold rows, then buyer allowances, then stock rows), which keeps them from deadlocking each other.
 */
const up = `
CREATE FUNCTION expire_holds(p_stock uuid, p_user uuid, p_batch uuid, p_limit integer)
RETURNS integer LANGUAGE plpgsql AS $fn$
DECLARE n integer;
BEGIN
  -- Nearly always nothing is due: find that out with one indexed look before taking any lock.
  IF NOT EXISTS (
    SELECT 1 FROM holds WHERE state = 'active' AND expires_at <= now()
      AND (p_stock IS NULL OR batch_stock_id = p_stock OR (user_id = p_user AND batch_id = p_batch))) THEN
    RETURN 0;
  END IF;
  WITH due AS (
    UPDATE holds SET state = 'expired', reason = 'time ran out', ended_at = now(), updated_at = now()
     WHERE id IN (
       SELECT id FROM holds
        WHERE state = 'active' AND expires_at <= now()
          AND (p_stock IS NULL OR batch_stock_id = p_stock OR (user_id = p_user AND batch_id = p_batch))
        ORDER BY id LIMIT p_limit FOR UPDATE SKIP LOCKED)
     RETURNING user_id, batch_id, batch_stock_id, quantity
  ), allowances AS (
    UPDATE buyer_allowances a SET taken = a.taken - d.q
      FROM (SELECT user_id, batch_id, sum(quantity)::int AS q FROM due GROUP BY 1, 2) d
     WHERE a.user_id = d.user_id AND a.batch_id = d.batch_id
     RETURNING 1
  ), stock AS (
    UPDATE batch_stock s SET held = s.held - d.q, updated_at = now()
      FROM (SELECT batch_stock_id, sum(quantity)::int AS q FROM due GROUP BY 1) d
     WHERE s.id = d.batch_stock_id
     RETURNING 1
  )
  SELECT count(*) INTO n FROM due;
  RETURN n;
END $fn$;

CREATE FUNCTION release_hold(p_hold uuid, p_user uuid)
RETURNS boolean LANGUAGE plpgsql AS $fn$
DECLARE h record;
BEGIN
  UPDATE holds SET state = CASE WHEN expires_at <= now() THEN 'expired' ELSE 'released' END,
         reason = CASE WHEN expires_at <= now() THEN 'time ran out' ELSE 'let go by the buyer' END,
         ended_at = now(), updated_at = now()
   WHERE id = p_hold AND user_id = p_user AND state = 'active'
   RETURNING user_id, batch_id, batch_stock_id, quantity INTO h;
  IF NOT FOUND THEN RETURN false; END IF;
  UPDATE buyer_allowances SET taken = taken - h.quantity WHERE user_id = h.user_id AND batch_id = h.batch_id;
  UPDATE batch_stock SET held = held - h.quantity, updated_at = now() WHERE id = h.batch_stock_id;
  RETURN true;
END $fn$;

-- Outcomes: held, batch_not_found, finish_unknown, batch_closed, not_open_yet, early_access_only,
-- limit_reached, sold_out. The stock row changes only through a conditional UPDATE, the per-buyer count
-- only through a conditional upsert of the buyer's allowance row: nothing is read and then written.
CREATE FUNCTION hold_stock(p_user uuid, p_batch uuid, p_finish uuid, p_quantity integer)
RETURNS TABLE (outcome text, hold_id uuid, expires_at timestamptz, early_access_at timestamptz,
               opens_at timestamptz, closes_at timestamptz, per_buyer_limit integer, may_come_back boolean)
LANGUAGE plpgsql AS $fn$
DECLARE
  b batches%ROWTYPE;
  s batch_stock%ROWTYPE;
  t timestamptz := now();
  new_id uuid;
  new_expiry timestamptz;
BEGIN
  SELECT * INTO b FROM batches WHERE id = p_batch AND status <> 'draft';
  IF NOT FOUND THEN RETURN QUERY SELECT 'batch_not_found', NULL::uuid, NULL::timestamptz, NULL::timestamptz, NULL::timestamptz, NULL::timestamptz, NULL::integer, false; RETURN; END IF;
  SELECT * INTO s FROM batch_stock WHERE batch_id = p_batch AND finish_id = p_finish;
  outcome := NULL;
  IF NOT FOUND THEN outcome := 'finish_unknown';
  ELSIF b.status = 'cancelled' OR t >= b.closes_at THEN outcome := 'batch_closed';
  ELSIF t < coalesce(b.early_access_at, b.opens_at) THEN outcome := 'not_open_yet';
  ELSIF t < b.opens_at AND NOT EXISTS (SELECT 1 FROM early_access_grants g WHERE g.batch_id = p_batch AND g.user_id = p_user) THEN
    outcome := 'early_access_only';
  ELSIF p_quantity > b.per_buyer_limit THEN outcome := 'limit_reached';
  END IF;
  IF outcome IS NULL THEN
    -- Stale holds of this finish, and the buyer's own in this batch, count as released from here on.
    PERFORM expire_holds(s.id, p_user, p_batch, 200);
    SELECT * INTO s FROM batch_stock WHERE id = s.id;
    IF s.available < p_quantity THEN
      -- Refused without writing anything: most attempts at a busy opening end here.
      outcome := 'sold_out';
    ELSE
      INSERT INTO buyer_allowances AS a (batch_id, user_id, taken, per_buyer_limit)
      VALUES (p_batch, p_user, p_quantity, b.per_buyer_limit)
      ON CONFLICT (batch_id, user_id) DO UPDATE SET taken = a.taken + EXCLUDED.taken
       WHERE a.taken + EXCLUDED.taken <= a.per_buyer_limit;
      IF NOT FOUND THEN
        outcome := 'limit_reached';
      ELSE
        UPDATE batch_stock SET held = held + p_quantity, updated_at = now()
         WHERE id = s.id AND available >= p_quantity;
        IF NOT FOUND THEN
          UPDATE buyer_allowances SET taken = taken - p_quantity WHERE batch_id = p_batch AND user_id = p_user;
          outcome := 'sold_out';
        ELSE
          INSERT INTO holds (user_id, batch_id, batch_stock_id, quantity, expires_at)
          VALUES (p_user, p_batch, s.id, p_quantity, t + make_interval(mins => b.hold_minutes))
          RETURNING id, holds.expires_at INTO new_id, new_expiry;
          outcome := 'held';
        END IF;
      END IF;
    END IF;
  END IF;
  IF outcome = 'sold_out' THEN SELECT held > 0 INTO may_come_back FROM batch_stock WHERE id = s.id; END IF;
  RETURN QUERY SELECT outcome, new_id, new_expiry, b.early_access_at, b.opens_at, b.closes_at, b.per_buyer_limit, coalesce(may_come_back, false);
END $fn$;
`;

module.exports = {
  async up(queryInterface) {
    await queryInterface.sequelize.query(up);
  },
  async down(queryInterface) {
    await queryInterface.sequelize.query(
      'DROP FUNCTION hold_stock(uuid, uuid, uuid, integer); DROP FUNCTION release_hold(uuid, uuid); DROP FUNCTION expire_holds(uuid, uuid, uuid, integer);',
    );
  },
};
