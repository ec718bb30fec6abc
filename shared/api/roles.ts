/** The four roles of product.md. A user holds exactly one. */
export const ROLES = ['inspector', 'quality', 'buyer', 'assembler'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  inspector: 'Inspector',
  quality: 'Quality engineer',
  buyer: 'Buyer',
  assembler: 'Assembler',
};

/** The product's areas (product.md), in navigation order. */
export const AREAS = ['dock', 'bench', 'bins', 'pairing', 'suppliers', 'catalog', 'admin'] as const;
export type Area = (typeof AREAS)[number];

export const AREA_LABELS: Record<Area, string> = {
  dock: 'Dock',
  bench: 'Bench',
  bins: 'Bins',
  pairing: 'Pairing',
  suppliers: 'Suppliers',
  catalog: 'Catalog',
  admin: 'Admin',
};

/** Which areas each role may open. The quality engineer can do everything an inspector can. */
export const AREAS_BY_ROLE: Record<Role, readonly Area[]> = {
  inspector: ['dock', 'bench', 'bins', 'catalog'],
  quality: ['dock', 'bench', 'bins', 'pairing', 'suppliers', 'catalog', 'admin'],
  buyer: ['suppliers', 'catalog'],
  assembler: ['pairing', 'bins', 'catalog'],
};

export function canUseArea(role: Role, area: Area): boolean {
  return AREAS_BY_ROLE[role].includes(area);
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
