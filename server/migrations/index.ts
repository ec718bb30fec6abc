import { Foundation1764600000000 } from './1764600000000-foundation.ts';
import { CatalogAndLots1764600100000 } from './1764600100000-catalog-and-lots.ts';
import { CatalogGuards1764600200000 } from './1764600200000-catalog-guards.ts';
import { Dock1764600300000 } from './1764600300000-dock.ts';
import { Bench1764600400000 } from './1764600400000-bench.ts';
import { OutgoingMail1764600500000 } from './1764600500000-outgoing-mail.ts';
import { Bins1764600600000 } from './1764600600000-bins.ts';
import { SupplierQuality1764600700000 } from './1764600700000-supplier-quality.ts';
import { Pairing1764600800000 } from './1764600800000-pairing.ts';

/** Migrations in the order they run. Never edit one that has run: add a new one. */
export const migrations = [Foundation1764600000000, CatalogAndLots1764600100000, CatalogGuards1764600200000, Dock1764600300000, Bench1764600400000, OutgoingMail1764600500000, Bins1764600600000, SupplierQuality1764600700000, Pairing1764600800000];
