-- PostGIS provides the geometry type, spatial indexes and ST_* functions every later table uses.
-- Creating an extension needs a superuser; on a managed database enable PostGIS once by hand.
CREATE EXTENSION IF NOT EXISTS postgis;
