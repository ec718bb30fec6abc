import { requireRole } from '../../http/guards.ts';

/**
 * Buyers and quality engineers use the Suppliers area, reads included; inspectors and assemblers
 * get 403. Put on every route: these routers are mounted at the API root next to others, so a
 * router-wide guard would also stop requests meant for the routers after them.
 */
export const buyerOrQuality = requireRole('buyer', 'quality');
