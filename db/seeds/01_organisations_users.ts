import bcrypt from 'bcryptjs';
import type { Knex } from 'knex';
import { DEMO_PASSWORD, demoAccounts, demoOrganisations, demoUsers } from './demo-people';

/** Idempotent: rows are keyed by slug / e-mail / (dealer, brand) and never inserted twice. */
export async function seed(knex: Knex): Promise<number> {
  let added = 0;
  for (const o of demoOrganisations) {
    const rows = await knex('organisations')
      .insert({
        slug: o.slug, kind: o.kind, name: o.name, country: o.country, time_zone: o.timeZone,
        address_line: o.addressLine, city: o.city, postcode: o.postcode, contact_email: o.contactEmail,
        currency: o.currency ?? null, max_labor_rate_minor: o.maxLaborRateMinor ?? null,
      })
      .onConflict('slug')
      .ignore()
      .returning('id');
    added += rows.length;
  }
  const orgs = new Map<string, { id: string; kind: string; currency: string | null }>(
    (await knex('organisations').select('slug', 'id', 'kind', 'currency')).map((r) => [r.slug, r]),
  );
  const org = (slug: string) => {
    const o = orgs.get(slug);
    if (!o) throw new Error(`demo organisation ${slug} missing`);
    return o;
  };

  const existing = new Set((await knex('users').select(knex.raw('lower(email) as email'))).map((r) => r.email));
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  for (const u of demoUsers) {
    if (existing.has(u.email.toLowerCase())) continue;
    const o = org(u.org);
    await knex('users').insert({
      organisation_id: o.id, org_kind: o.kind, email: u.email, name: u.name, password_hash: hash,
      role: u.role, units: u.units, time_zone: u.timeZone,
    });
    added++;
  }

  for (const a of demoAccounts) {
    const brand = org(a.brand);
    const rows = await knex('dealer_accounts')
      .insert({
        dealer_id: org(a.dealer).id, brand_id: brand.id, account_number: a.accountNumber,
        labor_rate_minor: a.laborRateMinor, currency: brand.currency,
      })
      .onConflict(['dealer_id', 'brand_id'])
      .ignore()
      .returning('id');
    added += rows.length;
  }
  return added;
}
