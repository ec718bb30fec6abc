import 'reflect-metadata';

if (!process.env.BINWRIGHT_DB_PORT || process.env.NODE_ENV !== 'test') {
  throw new Error('Server tests need the throwaway database: run them through `npm test` (scripts/test.ts).');
}
