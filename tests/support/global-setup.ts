// Placeholder replaced once the database set-up lands (see tests/support/test-db.ts).
export default async function setup() {}
