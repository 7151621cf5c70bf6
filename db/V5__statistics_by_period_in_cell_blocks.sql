-- Statistics are stored period-major: one row per dataset, parameter, period and block of 1024 consecutive cell ids,
-- each statistic packed as an array over the block's cells. A layer (one parameter, statistic and period over every
-- cell) is then a few contiguous rows instead of one row per cell scattered through the table, and the statistics
-- pass writes a thousand times fewer rows. Absent values are NaN inside the arrays (NULL in the view below).
CREATE TABLE statistic_block (
    dataset_id   integer NOT NULL,
    parameter    smallint NOT NULL,
    period       smallint NOT NULL,
    block        integer NOT NULL,                -- cell_id / 1024
    cell_ids     integer[] NOT NULL,              -- ascending; the cells that have this parameter and period
    count        integer[] NOT NULL,
    coverage     real[] NOT NULL,
    mean         real[] NOT NULL,
    sd           real[] NOT NULL,
    min          real[] NOT NULL,
    max          real[] NOT NULL,
    p10          real[] NOT NULL,
    p50          real[] NOT NULL,
    p90          real[] NOT NULL,
    p99          real[] NOT NULL,
    extra_width  smallint NOT NULL DEFAULT 0,     -- values per cell in extra (exceedance fractions or the power rose)
    extra        real[],                          -- extra_width values per cell, cell after cell; NULL when the width is 0
    PRIMARY KEY (dataset_id, parameter, period, block),
    CHECK (block >= 0 AND extra_width >= 0)
);
-- Float arrays barely compress; storing them uncompressed spares the writer the attempt and the reader the inflation.
ALTER TABLE statistic_block
    ALTER COLUMN cell_ids SET STORAGE EXTERNAL, ALTER COLUMN count SET STORAGE EXTERNAL,
    ALTER COLUMN coverage SET STORAGE EXTERNAL, ALTER COLUMN mean SET STORAGE EXTERNAL,
    ALTER COLUMN sd SET STORAGE EXTERNAL, ALTER COLUMN min SET STORAGE EXTERNAL,
    ALTER COLUMN max SET STORAGE EXTERNAL, ALTER COLUMN p10 SET STORAGE EXTERNAL,
    ALTER COLUMN p50 SET STORAGE EXTERNAL, ALTER COLUMN p90 SET STORAGE EXTERNAL,
    ALTER COLUMN p99 SET STORAGE EXTERNAL, ALTER COLUMN extra SET STORAGE EXTERNAL;

-- Cuts a block's extra array into one slice per cell in a single pass. PL/pgSQL keeps an array variable expanded,
-- so each slice costs the slice alone; subscripting the column once per cell would read the whole array each time.
CREATE FUNCTION statistic_extra_slices(extra real[], width integer)
    RETURNS TABLE (slot bigint, slice real[])
    LANGUAGE plpgsql IMMUTABLE STRICT PARALLEL SAFE AS $$
DECLARE
    packed real[] := extra;
    n integer := coalesce(cardinality(extra), 0) / nullif(width, 0);
BEGIN
    FOR i IN 1 .. coalesce(n, 0) LOOP
        slot := i;
        slice := packed[(i - 1) * width + 1 : i * width];
        RETURN NEXT;
    END LOOP;
END
$$;

-- Existing rows move over block by block; each cell's extra is padded with NaN to the block's widest (a block with
-- no extra at all aggregates placeholders, since array_agg refuses NULL arrays, and stores NULL).
INSERT INTO statistic_block
WITH widths AS (
    SELECT dataset_id, parameter, period, cell_id / 1024 AS block, coalesce(max(cardinality(extra)), 0) AS width
      FROM cell_statistic GROUP BY 1, 2, 3, 4
), padded AS (
    SELECT s.*, w.block, w.width,
           CASE WHEN w.width > 0 THEN
               (SELECT array_agg(coalesce(s.extra[k], 'NaN') ORDER BY k) FROM generate_series(1, w.width) k)
           END AS extra_padded
      FROM cell_statistic s
      JOIN widths w ON w.dataset_id = s.dataset_id AND w.parameter = s.parameter AND w.period = s.period
                   AND w.block = s.cell_id / 1024
)
SELECT dataset_id, parameter, period, block,
       array_agg(cell_id ORDER BY cell_id), array_agg(count ORDER BY cell_id), array_agg(coverage ORDER BY cell_id),
       array_agg(coalesce(mean, 'NaN') ORDER BY cell_id), array_agg(coalesce(sd, 'NaN') ORDER BY cell_id),
       array_agg(coalesce(min, 'NaN') ORDER BY cell_id), array_agg(coalesce(max, 'NaN') ORDER BY cell_id),
       array_agg(coalesce(p10, 'NaN') ORDER BY cell_id), array_agg(coalesce(p50, 'NaN') ORDER BY cell_id),
       array_agg(coalesce(p90, 'NaN') ORDER BY cell_id), array_agg(coalesce(p99, 'NaN') ORDER BY cell_id),
       max(width),
       CASE WHEN max(width) > 0 THEN
           (SELECT array_agg(v ORDER BY n) FROM unnest(array_agg(coalesce(extra_padded, '{NaN}') ORDER BY cell_id)) WITH ORDINALITY f(v, n))
       END
  FROM padded
 GROUP BY dataset_id, parameter, period, block;

DROP TABLE cell_statistic;

-- The statistics one row per cell, period and parameter, as SQL users and the screening queries read them.
CREATE VIEW cell_statistic AS
SELECT b.dataset_id, c.cell_id, b.period, b.parameter,
       nullif(c.mean, 'NaN') AS mean, nullif(c.sd, 'NaN') AS sd, nullif(c.min, 'NaN') AS min, nullif(c.max, 'NaN') AS max,
       nullif(c.p10, 'NaN') AS p10, nullif(c.p50, 'NaN') AS p50, nullif(c.p90, 'NaN') AS p90, nullif(c.p99, 'NaN') AS p99,
       c.count, c.coverage, c.extra
  FROM statistic_block b
 CROSS JOIN LATERAL (
       SELECT u.cell_id, u.mean, u.sd, u.min, u.max, u.p10, u.p50, u.p90, u.p99, u.count, u.coverage, e.slice AS extra
         FROM unnest(b.cell_ids, b.mean, b.sd, b.min, b.max, b.p10, b.p50, b.p90, b.p99, b.count, b.coverage)
              WITH ORDINALITY AS u(cell_id, mean, sd, min, max, p10, p50, p90, p99, count, coverage, slot)
         LEFT JOIN statistic_extra_slices(b.extra, b.extra_width) e ON e.slot = u.slot) c;

DO $$
BEGIN
    IF EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'atlas_reader') THEN
        GRANT SELECT ON statistic_block, cell_statistic TO atlas_reader;
    END IF;
END
$$;
