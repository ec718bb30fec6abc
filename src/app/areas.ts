import type { Area } from '../../shared/api/roles.ts';

/** What each area is for, in the product's own words (product.md). */
export const AREA_PURPOSE: Record<Area, string> = {
  dock: 'Scan supplier labels, log lots against their purchase order, attach certificates and photos, print lot travelers.',
  bench: 'Sampling plan per lot, fast hFE and Vbe capture, tester CSV import, lot statistics and the disposition.',
  bins: 'Screen lots 100 % into gain bins, manage containers and their positions, print bin labels, see stock per bin.',
  pairing: 'Request matched pairs and quads, reserve the best plan, print pick lists, confirm pulls by scanning.',
  suppliers: 'Lot quality per supplier, gain-drift alerts, nonconformance reports by e-mail, order-quantity planning.',
  catalog: 'Part types with test conditions and limits, gain-bin schemes, sampling settings.',
  admin: 'Users and roles, the audit trail, outgoing mail.',
};

export const AREA_PATH: Record<Area, string> = {
  dock: '/dock',
  bench: '/bench',
  bins: '/bins',
  pairing: '/pairing',
  suppliers: '/suppliers',
  catalog: '/catalog',
  admin: '/admin/users',
};
