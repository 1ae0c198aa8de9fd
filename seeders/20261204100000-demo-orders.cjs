'use strict';

const demo = require('./support/demo-orders.cjs');

const flow = ['to_cast', 'cast', 'trimmed', 'painted', 'packed', 'shipped'];
const emails = demo.orders.map((order) => order.email);

/** The stage moves that brought a mask to `stage`, each with when it happened and who moved it. */
function movesTo(stage, opensAt, offsetMs) {
  const when = (days) => new Date(opensAt + days * demo.DAY + offsetMs);
  if (stage === 'failed_casting') {
    return [
      { from: 'to_cast', to: 'cast', at: when(demo.stageDays.cast), by: 'hand' },
      { from: 'cast', to: 'failed_casting', at: when(demo.stageDays.cast + demo.failedAfterDays), by: 'owner' },
    ];
  }
  const moves = [];
  for (let i = 1; i <= flow.indexOf(stage); i += 1) {
    moves.push({ from: flow[i - 1], to: flow[i], at: when(demo.stageDays[flow[i]]), by: 'hand' });
  }
  return moves;
}

/**
 * Paid orders for the sold-out Autumn batch, priced as checkout prices them, with their holds, payments,
 * stage moves and one partial refund, each recorded as an order event. The batch's stock already counts
 * these masks as sold, so nothing here changes it: the seeder only checks that the two agree.
 */
module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });

    await queryInterface.sequelize.transaction(async (transaction) => {
      const [already] = await q(`SELECT count(*)::int AS n FROM users WHERE email IN (:emails)`, { emails }, transaction);
      if (already.n > 0) return; // Seeded before: down removes them first.

      const [batch] = await q(
        `SELECT b.id, b.opens_at, b.hold_minutes, b.per_buyer_limit, d.name AS design_name, d.base_price_minor, d.currency,
                d.parcel_length_mm, d.parcel_width_mm, d.parcel_height_mm, d.parcel_weight_g,
                st.id AS studio_id, st.tax_label, st.tax_rate_bp, st.volumetric_divisor
           FROM batches b JOIN designs d ON d.id = b.design_id JOIN studios st ON st.id = d.studio_id
          WHERE b.name = :name`,
        { name: demo.batchName },
        transaction,
      );
      if (!batch) throw new Error(`The demo orders need the "${demo.batchName}" batch; run the drops seeder first.`);
      const stock = await q(
        `SELECT s.id, s.quantity, s.held, s.sold, f.slug, f.name, f.price_difference_minor
           FROM batch_stock s JOIN finishes f ON f.id = s.finish_id WHERE s.batch_id = :batch`,
        { batch: batch.id },
        transaction,
      );
      const stockBySlug = new Map(stock.map((row) => [row.slug, row]));
      for (const row of stock) {
        const lines = demo.orders.filter((order) => order.finish === row.slug).length;
        if (row.sold !== lines || row.held !== 0) {
          throw new Error(`${demo.batchName}, ${row.name}: stock says ${row.sold} sold and ${row.held} held, the demo orders have ${lines} masks.`);
        }
      }

      const users = await q(`SELECT id, email FROM users WHERE email IN (:emails)`, { emails: Object.values(demo.makers) }, transaction);
      const actor = Object.fromEntries(Object.entries(demo.makers).map(([key, email]) => [key, users.find((u) => u.email === email)?.id ?? null]));
      const zones = await q(
        `SELECT z.countries, json_agg(json_build_object('id', r.id, 'label', r.label, 'up_to_grams', r.up_to_grams, 'amount_minor', r.amount_minor,
                  'min_days', r.min_days, 'max_days', r.max_days) ORDER BY r.id) AS rates
           FROM shipping_zones z JOIN shipping_rates r ON r.zone_id = z.id WHERE z.studio_id = :studio GROUP BY z.id ORDER BY z.position`,
        { studio: batch.studio_id },
        transaction,
      );
      const parcel = { lengthMm: batch.parcel_length_mm, widthMm: batch.parcel_width_mm, heightMm: batch.parcel_height_mm, weightG: batch.parcel_weight_g };
      const opensAt = new Date(batch.opens_at).getTime();
      const event = (orderId, type, { from = null, to = null, by = null, data = {}, at }) =>
        q(
          `INSERT INTO order_events (order_id, type, from_state, to_state, actor_user_id, data, created_at)
           VALUES (:orderId, :type, :from, :to, :actor, :data::jsonb, :at) RETURNING id`,
          { orderId, type, from, to, actor: by && actor[by], data: JSON.stringify(data), at },
          transaction,
        );

      // Numbers come from the sequence in the order checkouts started, as they do for real.
      const inOrder = [...demo.orders].sort((a, b) => a.holdAt - b.holdAt);
      for (const [index, buyer] of inOrder.entries()) {
        const finish = stockBySlug.get(buyer.finish);
        if (!finish) throw new Error(`${demo.batchName} has no ${buyer.finish} stock.`);
        const zone = zones.find((z) => z.countries.map((c) => c.trim()).includes(buyer.address.country));
        const weight = demo.chargeableWeightG(parcel, 1, batch.volumetric_divisor);
        const rate = zone && demo.shippingRateFor(zone.rates, buyer.shipping, weight);
        if (!rate) throw new Error(`No "${buyer.shipping}" rate to ${buyer.address.country} for ${weight} g.`);

        const unitPrice = batch.base_price_minor + finish.price_difference_minor;
        const total = unitPrice + rate.amount_minor;
        const heldAt = new Date(opensAt + buyer.holdAt * 1000);
        const startedAt = new Date(heldAt.getTime() + 20_000);
        const paidAt = new Date(heldAt.getTime() + buyer.paidAfter * 1000);
        const moves = movesTo(buyer.stage, opensAt, index * 47 * demo.MINUTE);
        const refund = buyer.refund && { ...buyer.refund, amount: buyer.refund.amount === 'shipping' ? rate.amount_minor : buyer.refund.amount };
        const refundAt = refund && new Date(opensAt + refund.afterDays * demo.DAY + index * 47 * demo.MINUTE);
        const left = moves.length > 0;
        const allShipped = buyer.stage === 'shipped';
        const state = refund ? 'partly_refunded' : allShipped ? 'shipped' : left ? 'in_production' : 'paid';
        const lastChange = refundAt ?? moves.at(-1)?.at ?? paidAt;
        const tag = `autumn_${String(index + 1).padStart(2, '0')}`;
        const shipment = demo.shipmentOf(buyer, allShipped ? moves.at(-1).at : null);

        const [user] = await q(
          `INSERT INTO users (email, name, role, email_verified, created_at, updated_at)
           VALUES (:email, :name, 'customer', :at, :at, :at) RETURNING id`,
          { email: buyer.email, name: buyer.name, at: new Date(opensAt - 3 * demo.DAY + index * demo.HOUR) },
          transaction,
        );
        const [hold] = await q(
          `INSERT INTO holds (user_id, batch_id, batch_stock_id, quantity, state, reason, expires_at, ended_at, created_at, updated_at)
           VALUES (:user, :batch, :stock, 1, 'converted', 'paid', :expires, :paidAt, :heldAt, :paidAt) RETURNING id`,
          { user: user.id, batch: batch.id, stock: finish.id, expires: new Date(heldAt.getTime() + batch.hold_minutes * demo.MINUTE), paidAt, heldAt },
          transaction,
        );
        await q(
          `INSERT INTO buyer_allowances (batch_id, user_id, taken, per_buyer_limit) VALUES (:batch, :user, 1, :limit) RETURNING user_id`,
          { batch: batch.id, user: user.id, limit: batch.per_buyer_limit },
          transaction,
        );
        const [order] = await q(
          `INSERT INTO orders (studio_id, batch_id, user_id, hold_id, state, email, buyer_name, currency, lines_minor, shipping_minor, total_minor,
                               tax_label, tax_rate_bp, tax_included_minor, shipping_country, shipping_rate_id, shipping_label, shipping_min_days,
                               shipping_max_days, chargeable_weight_g, ship_to, round_started_at, payment_intent_id, paid_minor, refunded_minor,
                               paid_at, carrier_name, tracking_number, tracking_url, shipped_at, created_at, updated_at)
           VALUES (:studio, :batch, :user, :hold, :state, :email, :name, :currency, :lines, :shipping, :total, :taxLabel, :taxRate, :tax,
                   :country, :rateId, :rateLabel, :minDays, :maxDays, :weight, :shipTo::jsonb, :startedAt, :intent, :total, :refunded,
                   :paidAt, :carrier_name, :tracking_number, :tracking_url, :shipped_at, :startedAt, :lastChange)
           RETURNING id`,
          {
            studio: batch.studio_id, batch: batch.id, user: user.id, hold: hold.id, state, email: buyer.email, name: buyer.name,
            currency: batch.currency, lines: unitPrice, shipping: rate.amount_minor, total, taxLabel: batch.tax_label,
            taxRate: batch.tax_rate_bp, tax: demo.includedTaxMinor(total, batch.tax_rate_bp), country: buyer.address.country,
            rateId: rate.id, rateLabel: rate.label, minDays: rate.min_days, maxDays: rate.max_days, weight,
            shipTo: JSON.stringify({ name: buyer.name, address: { line2: null, state: null, ...buyer.address } }),
            intent: `pi_demo_${tag}`, refunded: refund?.amount ?? 0, paidAt, startedAt, lastChange, ...shipment,
          },
          transaction,
        );
        const [line] = await q(
          `INSERT INTO order_lines (order_id, position, batch_stock_id, design_name, finish_name, unit_price_minor, counted_in_stock, stage,
                                    created_at, updated_at)
           VALUES (:order, 1, :stock, :design, :finish, :price, true, :stage, :startedAt, :updated) RETURNING id`,
          { order: order.id, stock: finish.id, design: batch.design_name, finish: finish.name, price: unitPrice, stage: buyer.stage, startedAt,
            updated: moves.at(-1)?.at ?? paidAt },
          transaction,
        );
        await q(
          `INSERT INTO checkout_sessions (id, order_id, round, status, expires_at, created_at, updated_at)
           VALUES (:id, :order, 1, 'complete', :expires, :startedAt, :paidAt) RETURNING id`,
          { id: `cs_demo_${tag}`, order: order.id, expires: new Date(startedAt.getTime() + 45 * demo.MINUTE), startedAt, paidAt },
          transaction,
        );

        await event(order.id, 'checkout_started', { to: 'awaiting_payment', data: { country: buyer.address.country, shipping: rate.label }, at: startedAt });
        await event(order.id, 'paid', {
          from: 'awaiting_payment', to: 'paid', data: { paymentIntentId: `pi_demo_${tag}`, amountMinor: total, late: false, oversoldLines: 0 }, at: paidAt,
        });
        for (const move of moves) {
          await event(order.id, 'line_stage', { by: move.by, data: { lineId: line.id, from: move.from, to: move.to }, at: move.at });
          if (move.from === 'to_cast') await event(order.id, 'state_changed', { from: 'paid', to: 'in_production', by: move.by, at: move.at });
          if (move.to === 'shipped') {
            // As shipping records it: one event with the state change and the parcel.
            const parcel = { carrierName: shipment.carrier_name, trackingNumber: shipment.tracking_number, trackingUrl: shipment.tracking_url, lines: 1 };
            await event(order.id, 'shipped', { from: 'in_production', to: 'shipped', by: move.by, data: parcel, at: move.at });
          }
        }
        if (refund) {
          const [row] = await q(
            `INSERT INTO refunds (order_id, payment_intent_id, stripe_refund_id, amount_minor, currency, reason, note, status, created_by, created_at, updated_at)
             VALUES (:order, :intent, :stripeId, :amount, :currency, :reason, :note, 'succeeded', :owner, :at, :at) RETURNING id`,
            { order: order.id, intent: `pi_demo_${tag}`, stripeId: `re_demo_${tag}`, amount: refund.amount, currency: batch.currency,
              reason: refund.reason, note: refund.note, owner: actor.owner, at: refundAt },
            transaction,
          );
          const data = { refundId: row.id, amountMinor: refund.amount, reason: refund.reason };
          await event(order.id, 'refund_requested', { by: 'owner', data: { ...data, lines: 0 }, at: refundAt });
          await event(order.id, 'refunded', { from: left ? 'in_production' : 'paid', to: 'partly_refunded', data, at: refundAt });
        }
      }
    });
  },

  async down(queryInterface) {
    // Lines, events and sessions go with their orders; holds and allowances with their buyers.
    await queryInterface.sequelize.transaction(async (transaction) => {
      const mine = `SELECT o.id FROM orders o JOIN users u ON u.id = o.user_id WHERE u.email IN (:emails)`;
      await queryInterface.sequelize.query(
        `DELETE FROM refunds WHERE order_id IN (${mine});
         DELETE FROM orders WHERE id IN (${mine});
         DELETE FROM users WHERE email IN (:emails);`,
        { replacements: { emails }, transaction },
      );
    });
  },
};
