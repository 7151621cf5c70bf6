-- Measuring stations (buoys) with their records, and device power matrices.
-- These are small reference tables, not keyed by cell: a station is validated against any dataset that covers it,
-- and a device matrix is applied to any dataset. When the database is distributed by cell they become reference
-- tables (copied to every node); the per-cell key convention of V1 is untouched.

CREATE TABLE station (
    station_id        integer GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
    slug              text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9][a-z0-9-]{0,62}$'),
    name              text NOT NULL CHECK (length(btrim(name)) BETWEEN 1 AND 200),
    geom              geometry(Point, 4326) NOT NULL,
    depth_m           real CHECK (depth_m IS NULL OR depth_m > 0),
    instrument        text NOT NULL,
    role              text NOT NULL CHECK (role IN ('calibration', 'validation')),
    source_file       text NOT NULL,                 -- file name as given, without its folder
    source_sha256     text NOT NULL CHECK (source_sha256 ~ '^[0-9a-f]{64}$'),
    source_format     text NOT NULL CHECK (source_format IN ('csv', 'netcdf')),
    observation_count integer NOT NULL,
    flagged_count     integer NOT NULL,
    has_tp            boolean NOT NULL,
    has_te            boolean NOT NULL,
    has_dir           boolean NOT NULL,
    time_start        timestamptz NOT NULL,
    time_end          timestamptz NOT NULL,
    loaded_at         timestamptz NOT NULL DEFAULT now()
);
CREATE UNIQUE INDEX station_name_idx ON station (lower(name));
CREATE INDEX station_sha256_idx ON station (source_sha256);
CREATE INDEX station_geom_idx ON station USING gist (geom);

-- One row of a station record. Values are NULL where the station did not measure them; qc 0 is a good row, any other
-- value a row the station's quality control rejected (kept so that matching can count it).
CREATE TABLE station_observation (
    station_id  integer NOT NULL REFERENCES station ON DELETE CASCADE,
    time        timestamptz NOT NULL,
    hs          real,
    tp          real,
    te          real,
    dir         real,
    qc          smallint NOT NULL DEFAULT 0,
    PRIMARY KEY (station_id, time)
);

-- A device's power matrix: electrical power (kW) at bin centres of Hs (rows) and of Te or Tp (columns).
-- power_kw is a two-dimensional array [Hs bin][period bin].
CREATE TABLE device_matrix (
    matrix_id         integer GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
    slug              text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9][a-z0-9-]{0,62}$'),
    name              text NOT NULL CHECK (length(btrim(name)) BETWEEN 1 AND 200),
    axis_kind         text NOT NULL CHECK (axis_kind IN ('te', 'tp')),
    hs_centres_m      double precision[] NOT NULL CHECK (cardinality(hs_centres_m) >= 2),
    period_centres_s  double precision[] NOT NULL CHECK (cardinality(period_centres_s) >= 2),
    power_kw          double precision[] NOT NULL CHECK (array_ndims(power_kw) = 2),
    rated_power_kw    double precision NOT NULL CHECK (rated_power_kw > 0),
    source_file       text NOT NULL,
    source_sha256     text NOT NULL CHECK (source_sha256 ~ '^[0-9a-f]{64}$'),
    created_at        timestamptz NOT NULL DEFAULT now(),
    CHECK (array_length(power_kw, 1) = cardinality(hs_centres_m) AND array_length(power_kw, 2) = cardinality(period_centres_s))
);
CREATE UNIQUE INDEX device_matrix_name_idx ON device_matrix (lower(name));
