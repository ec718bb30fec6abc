import { Foundation1764600000000 } from './1764600000000-foundation.ts';

/** Migrations in the order they run. Never edit one that has run: add a new one. */
export const migrations = [Foundation1764600000000];
