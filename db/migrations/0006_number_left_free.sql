-- No change. Three branches each added a migration at the same place in the journal
-- (review notices as 0005, results aggregates as 0007, multipolygon zones as 0008) and no
-- migration was ever written as 0006 (git log --all -- db/migrations). This entry fills the
-- number so that journal positions and file numbers agree again: drizzle-kit generate names
-- the next file after the last entry's position, which would otherwise have been 0008 again.
SELECT 1;
