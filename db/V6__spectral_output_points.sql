-- Spectral output points: a dataset of grid kind 'stations' holds one cell per output point. Its series (Hs, Te, Tp,
-- mean direction, spread, integrated from each step's spectrum) are stored in series_chunk like any cell's; what only a
-- spectrum gives is kept here, so the spectra themselves (45 frequencies x 24 directions x 2,920 steps x 4 bytes =
-- 12.6 MB per station-year) need not be stored.
ALTER TABLE dataset DROP CONSTRAINT dataset_grid_kind_check;
ALTER TABLE dataset ADD CONSTRAINT dataset_grid_kind_check
    CHECK (grid_kind IN ('regular', 'curvilinear', 'projected', 'mesh', 'stations'));

-- The per-step spectral values of one station-year, aligned with dataset_year.times (NaN where the step is missing):
-- J from the spectrum and J from Hm0 and Te (kW/m), the directionality coefficient, the direction of the largest
-- resolved power (degrees, coming from) and the spectral width eps0. 5 x 4 bytes per step: 58 kB per 3-hourly year.
CREATE TABLE station_step (
    dataset_id        integer NOT NULL REFERENCES dataset ON DELETE CASCADE,
    cell_id           integer NOT NULL,
    year              smallint NOT NULL,
    j_spectral        real[] NOT NULL,
    j_parametric      real[] NOT NULL,
    directionality    real[] NOT NULL,
    max_power_from    real[] NOT NULL,
    spectral_width    real[] NOT NULL,
    PRIMARY KEY (dataset_id, cell_id, year)
);

-- Sums over the steps of one station-month of the frequency spectrum S(f) (m2 s, on the dataset's frequencies) and of
-- each direction bin's power (kW/m, on its directions): any period's mean spectrum and mean directionally resolved power
-- are sums of these over its months divided by their steps. (45 + 24) x 8 bytes per month: 6.6 kB per station-year.
CREATE TABLE station_spectrum_month (
    dataset_id        integer NOT NULL REFERENCES dataset ON DELETE CASCADE,
    cell_id           integer NOT NULL,
    year              smallint NOT NULL,
    month             smallint NOT NULL CHECK (month BETWEEN 1 AND 12),
    steps             integer NOT NULL,
    frequency_sum     double precision[] NOT NULL,
    direction_sum     double precision[] NOT NULL,
    PRIMARY KEY (dataset_id, cell_id, year, month)
);
