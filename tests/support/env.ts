/** The test database, created fresh by `npm test` (scripts/test.mjs). */
export function testDatabaseUrl(): string {
  const url = process.env.TEST_DATABASE_URL;
  if (!url) throw new Error('TEST_DATABASE_URL is not set: run the tests with `npm test`');
  return url;
}
