-- Nearest-cell searches (KNN) always name one dataset. Indexes over every dataset's cells made such a search walk the
-- cells of other datasets nearby, one by one, wherever datasets overlap (a dataset of output points inside a large
-- grid, a nested grid): the search of a 120-cell dataset inside a 300,000-cell one took over a second. Led by the
-- dataset id (btree_gist gives GiST the integer equality; a trusted extension of PostgreSQL's contrib, as PostGIS is
-- installed here), the index takes a search straight to the dataset's own cells.
CREATE EXTENSION IF NOT EXISTS btree_gist;

CREATE INDEX cell_wet_dataset_geom_idx ON cell USING gist (dataset_id, geom) WHERE wet;
CREATE INDEX cell_dry_dataset_geom_idx ON cell USING gist (dataset_id, geom) WHERE NOT wet;
DROP INDEX cell_wet_geom_idx;
DROP INDEX cell_dry_geom_idx;
