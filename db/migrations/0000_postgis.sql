-- PostGIS must exist before any geometry column. The set-up scripts create it as the
-- superuser first (an ordinary owner cannot), so this is a no-op there.
CREATE EXTENSION IF NOT EXISTS postgis;
