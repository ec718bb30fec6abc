import { Foundation1764600000000 } from './1764600000000-foundation.ts';
import { CatalogAndLots1764600100000 } from './1764600100000-catalog-and-lots.ts';
import { CatalogGuards1764600200000 } from './1764600200000-catalog-guards.ts';

/** Migrations in the order they run. Never edit one that has run: add a new one. */
export const migrations = [Foundation1764600000000, CatalogAndLots1764600100000, CatalogGuards1764600200000];
