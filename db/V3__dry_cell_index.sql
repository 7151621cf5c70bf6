-- Nearest dry cell (the coast proxy) by KNN needs an index over the dry cells; the wet-cell index cannot serve it.
CREATE INDEX cell_dry_geom_idx ON cell USING gist (geom) WHERE NOT wet;
