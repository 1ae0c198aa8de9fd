'use strict';

// The demo's waitlists: people who missed the Ibex and Hare drops, most confirmed, some still pending, a few
// who left, joined over the last two months so the workshop's chart has a shape. Juno Pell is confirmed on the
// Hare list, so scheduling a new Hare batch in the workshop sends her the announcement with her early-access
// link. Every name and address is invented; the addresses use the reserved example domains.
const first = ['Ailbhe', 'Bram', 'Cora', 'Dev', 'Edda', 'Fionn', 'Greer', 'Hollis', 'Isha', 'Jory', 'Kesi', 'Lorcan', 'Mira', 'Nell', 'Oisin', 'Pia'];
const last = ['Ashby', 'Birchall', 'Coyle', 'Dunmore', 'Ellery', 'Farrow', 'Gillan', 'Harte', 'Inchley', 'Joyce'];
const domains = ['example.com', 'example.net', 'example.org'];

/** A fixed, repeatable spread: entry i of a design, its state and how many days ago it joined. */
function people(count, offset) {
  return Array.from({ length: count }, (_, i) => {
    const n = i + offset;
    const name = `${first[n % first.length]} ${last[(n * 7) % last.length]}`;
    const email = `${name.toLowerCase().replace(' ', '.')}${n}@${domains[n % domains.length]}`;
    const state = n % 11 === 0 ? 'left' : n % 5 === 0 ? 'pending' : 'confirmed';
    return { email, state, daysAgo: 2 + ((n * 13) % 58) };
  });
}

module.exports = {
  async up(queryInterface) {
    const q = (sql, replacements, transaction) =>
      queryInterface.sequelize.query(sql, { replacements, transaction, type: queryInterface.sequelize.QueryTypes.SELECT });
    await queryInterface.sequelize.transaction(async (transaction) => {
      const designs = await q(`SELECT id, slug FROM designs WHERE slug IN ('ibex', 'hare')`, {}, transaction);
      const [juno] = await q(`SELECT id FROM users WHERE email = 'juno@example.com'`, {}, transaction);
      for (const design of designs) {
        const list = people(design.slug === 'hare' ? 34 : 21, design.slug === 'hare' ? 0 : 100);
        if (design.slug === 'hare' && juno) list.push({ email: 'juno@example.com', state: 'confirmed', daysAgo: 9, userId: juno.id });
        for (const person of list) {
          await q(
            `INSERT INTO waitlist_entries (design_id, email, user_id, state, source, time_zone, confirmed_at, left_at, created_at, updated_at)
             VALUES (:design, :email, :user, :state, 'design_page', 'Europe/Dublin',
                     CASE WHEN :state IN ('confirmed', 'left') THEN now() - make_interval(days => :days) + interval '10 minutes' END,
                     CASE WHEN :state = 'left' THEN least(now() - interval '1 hour', now() - make_interval(days => :days) + interval '3 days') END,
                     now() - make_interval(days => :days), now())
             RETURNING id`,
            { design: design.id, email: person.email, user: person.userId ?? null, state: person.state, days: person.daysAgo },
            transaction,
          );
        }
      }
    });
  },

  async down(queryInterface) {
    await queryInterface.sequelize.query(`DELETE FROM waitlist_entries WHERE source = 'design_page'`);
  },
};
