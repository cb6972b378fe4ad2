-- scripts/parts.sql: the independent parts of a network export held in PostGIS, for a check split
-- over several rimline processes (README, "Past one machine").
--
--   psql "$PG" -v pipes=pipes -v structures=structures -v tol=0.5 -f scripts/parts.sql
--
-- Variables: pipes, structures (the two tables, required); tol (the project's snap tolerance, in the
-- layers' CRS units; default 0.5); id (their key column, default ogc_fid, what ogr2ogr makes);
-- geom (their geometry column, default geom).
--
-- It writes the table rimline_parts (layer, fid, part): every pipe and structure with the number of
-- the cluster of touching geometries it belongs to: ST_ClusterDBSCAN with eps = the snap tolerance
-- and minpoints = 1 puts two features in one part when they are within the tolerance of each other,
-- directly or through a chain of others. rimline connects pipes and structures by their geometry
-- within that tolerance, so an outfall tree, or a looped component, lies in one part. The export's
-- tables are not changed. A part's filter (for `rimline check --where`, or `where` in the project):
--   pipes=ogc_fid IN (SELECT fid FROM rimline_parts WHERE layer = 'pipes' AND part IN (0, 2))
--   structures=ogc_fid IN (SELECT fid FROM rimline_parts WHERE layer = 'structures' AND part IN (0, 2))
-- Limits: pieces joined only by from/to ids (no geometry within the tolerance) land in different
-- parts; so do a pump station and the structure its force main discharges into when only the
-- [[pump_stations]] discharge names it. A structure without any pipe is a part of its own.
\set ON_ERROR_STOP on
\if :{?tol}
\else
  \set tol 0.5
\endif
\if :{?id}
\else
  \set id ogc_fid
\endif
\if :{?geom}
\else
  \set geom geom
\endif

DROP TABLE IF EXISTS rimline_parts;
CREATE TABLE rimline_parts AS
SELECT layer, fid, ST_ClusterDBSCAN(g, eps := :tol, minpoints := 1) OVER () AS part
FROM (SELECT 'pipes'::text AS layer, :"id"::bigint AS fid, :"geom" AS g FROM :"pipes"
      UNION ALL
      SELECT 'structures'::text, :"id"::bigint, :"geom" FROM :"structures") AS features;
CREATE INDEX ON rimline_parts (layer, part, fid);
ANALYZE rimline_parts;

-- The list of parts: the units of work, largest first (hand them out to processes in this order).
SELECT part,
       count(*) FILTER (WHERE layer = 'pipes') AS pipes,
       count(*) FILTER (WHERE layer = 'structures') AS structures
FROM rimline_parts GROUP BY part ORDER BY pipes DESC, part;
