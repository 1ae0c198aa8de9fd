// Plain data, safe to import anywhere (client components included).
export const roles = ['customer', 'staff', 'owner'] as const;
export type Role = (typeof roles)[number];

// Each role can do everything the ones before it can.
const rank: Record<Role, number> = { customer: 0, staff: 1, owner: 2 };

export function hasRole(actual: Role, needed: Role): boolean {
  return rank[actual] >= rank[needed];
}

export const roleLabels: Record<Role, string> = {
  customer: 'Buyer',
  staff: 'Studio hand',
  owner: 'Maker (owner)',
};
