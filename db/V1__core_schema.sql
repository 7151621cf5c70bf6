-- Core schema of the wave-resource atlas.
-- Every per-cell table is keyed by (dataset_id, cell_id, ...) and has no foreign key across cells, so it can
-- be distributed by cell on a distributed PostgreSQL without changing queries (see deploy/SCALING.md).
CREATE EXTENSION IF NOT EXISTS postgis;

CREATE TABLE dataset (
    dataset_id   integer GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
    slug         text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9][a-z0-9-]{0,62}$'),
    title        text NOT NULL,
    grid_kind    text NOT NULL CHECK (grid_kind IN ('regular', 'curvilinear', 'projected', 'mesh')),
    nx           integer,
    ny           integer,
    point_count  integer NOT NULL,
    extent       geometry(Polygon, 4326),
    grid         jsonb NOT NULL DEFAULT '{}'::jsonb,      -- axes of a regular grid, mapping notes
    metadata     jsonb NOT NULL DEFAULT '{}'::jsonb,      -- variables, units, method notes, licence
    created_at   timestamptz NOT NULL DEFAULT now()
);

-- The time line of each year of a dataset: the instants (Unix seconds, UTC, strictly increasing) that the
-- values of every series chunk of that year are aligned with. Small; a reference table when distributed.
CREATE TABLE dataset_year (
    dataset_id   integer NOT NULL REFERENCES dataset ON DELETE CASCADE,
    year         smallint NOT NULL,
    times        bigint[] NOT NULL,
    PRIMARY KEY (dataset_id, year)
);

CREATE TABLE cell (
    dataset_id        integer NOT NULL,
    cell_id           integer NOT NULL,          -- point index in the source grid (row-major j*nx+i, or mesh node)
    grid_i            integer,
    grid_j            integer,
    geom              geometry(Point, 4326) NOT NULL,
    depth_m           real,                      -- NULL where the source has no depth (treated as deep water)
    wet               boolean NOT NULL,
    coast_distance_m  real,
    PRIMARY KEY (dataset_id, cell_id)
);
CREATE INDEX cell_wet_geom_idx ON cell USING gist (geom) WHERE wet;

CREATE TABLE mesh_triangle (
    dataset_id  integer NOT NULL,
    triangle_id integer NOT NULL,
    node_a      integer NOT NULL,
    node_b      integer NOT NULL,
    node_c      integer NOT NULL,
    PRIMARY KEY (dataset_id, triangle_id)
);

-- One year of one cell: every variable quantised to 16 bits (scheme in SeriesCodec.cs), aligned with
-- dataset_year.times. Stored uncompressed out of line: the values are noisy and reads must be fast.
CREATE TABLE series_chunk (
    dataset_id  integer NOT NULL,
    cell_id     integer NOT NULL,
    year        smallint NOT NULL,
    step_count  integer NOT NULL,
    payload     bytea NOT NULL,
    written_at  timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (dataset_id, cell_id, year)
);
ALTER TABLE series_chunk ALTER COLUMN payload SET STORAGE EXTERNAL;

CREATE TABLE source_file (
    dataset_id   integer NOT NULL REFERENCES dataset ON DELETE CASCADE,
    file_id      integer GENERATED ALWAYS AS IDENTITY,
    file_name    text NOT NULL,
    sha256       text NOT NULL,
    size_bytes   bigint NOT NULL,
    time_start   timestamptz NOT NULL,
    time_end     timestamptz NOT NULL,
    step_count   integer NOT NULL,
    job_id       bigint,
    loaded_at    timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (dataset_id, file_id),
    UNIQUE (dataset_id, sha256)
);

-- Statistics of one parameter of one cell over one period (period codes: 0 annual, 1..12 months,
-- 13..16 DJF MAM JJA SON, a four-digit year for that year alone).
CREATE TABLE cell_statistic (
    dataset_id   integer NOT NULL,
    cell_id      integer NOT NULL,
    period       smallint NOT NULL,
    parameter    smallint NOT NULL,
    mean         real,
    sd           real,
    min          real,
    max          real,
    p10          real,
    p50          real,
    p90          real,
    p99          real,
    count        integer NOT NULL,
    coverage     real NOT NULL,
    extra        real[],                          -- exceedance fractions, or the power rose for direction
    PRIMARY KEY (dataset_id, cell_id, period, parameter)
);
CREATE INDEX cell_statistic_layer_idx ON cell_statistic (dataset_id, parameter, period);

-- When each cell's statistics were last computed; cells whose chunks are newer are recomputed.
CREATE TABLE cell_statistic_state (
    dataset_id   integer NOT NULL,
    cell_id      integer NOT NULL,
    computed_at  timestamptz NOT NULL,
    PRIMARY KEY (dataset_id, cell_id)
);

CREATE TABLE job (
    job_id        bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
    kind          text NOT NULL CHECK (kind IN ('ingest', 'statistics')),
    dataset_slug  text NOT NULL,
    state         text NOT NULL DEFAULT 'queued' CHECK (state IN ('queued', 'running', 'done', 'failed')),
    payload       jsonb NOT NULL DEFAULT '{}'::jsonb,
    attempts      integer NOT NULL DEFAULT 0,
    claimed_by    text,
    claimed_at    timestamptz,
    heartbeat_at  timestamptz,
    finished_at   timestamptz,
    progress      jsonb,
    error         text,
    summary       text,
    created_at    timestamptz NOT NULL DEFAULT now()
);
CREATE INDEX job_queue_idx ON job (created_at) WHERE state = 'queued';

-- Rendered layer downloads, keyed by what produced them; dropped when the dataset's statistics change.
CREATE TABLE layer_cache (
    dataset_id   integer NOT NULL REFERENCES dataset ON DELETE CASCADE,
    cache_key    text NOT NULL,
    etag         text NOT NULL,
    content_type text NOT NULL,
    content      bytea NOT NULL,
    created_at   timestamptz NOT NULL DEFAULT now(),
    PRIMARY KEY (dataset_id, cache_key)
);
