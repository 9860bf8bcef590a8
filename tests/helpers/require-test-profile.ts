// API tests write to a real database: make sure it is the test profile's, which npm test bootstraps.
if (process.env.NODE_ENV !== 'test') {
  throw new Error(
    'API tests run through "npm test" (or "npm test -- --only=vitest"), which starts the test database first.',
  );
}
