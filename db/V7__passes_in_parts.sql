-- A pass run in parts that any worker claims from the job queue.
-- statistics: the statistics of a dataset computed as blocks of cells. The parts write to a staging table keyed by the
--   pass; the part that finishes last moves the staged blocks into statistic_block and stamps the cells in one
--   transaction, so readers see the previous statistics until the whole pass is stored, and the statistics stamp
--   (max computed_at, count of cell_statistic_state) moves once.
-- ingest: the first load of a new dataset, as ranges of cells. The dataset's id is reserved when the pass is queued;
--   each part writes its cells' series chunks under that id in one transaction, and the last part creates the dataset
--   row, its cells, time lines and source files in its own. Until then no dataset row names the id, so readers (who
--   find datasets by slug) see nothing of it.
CREATE TABLE pass (
    pass_id       bigint GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
    dataset_id    integer NOT NULL,                     -- no foreign key: an ingest pass's dataset row comes at its end
    dataset_slug  text NOT NULL,
    kind          text NOT NULL CHECK (kind IN ('statistics', 'ingest')),
    state         text NOT NULL DEFAULT 'open' CHECK (state IN ('open', 'done', 'failed')),
    payload       jsonb NOT NULL DEFAULT '{}'::jsonb,   -- the options of the pass and the metadata it records at the end
    part_count    integer NOT NULL CHECK (part_count > 0),
    blocks        integer[] NOT NULL,                   -- statistics: the blocks of 1,024 cell ids it recomputes, ascending
    computed_at   timestamptz NOT NULL,                 -- the stamp the pass gives its cells (its start, as a plain pass)
    created_at    timestamptz NOT NULL DEFAULT now(),
    finished_at   timestamptz,
    error         text
);
-- Two passes of one dataset never interleave: a second is refused while one is open.
CREATE UNIQUE INDEX pass_one_open_per_dataset ON pass (dataset_slug) WHERE state = 'open';

-- A part is a job of the queue: claimed, leased, heart-beaten and requeued like any other. It is marked done in the
-- transaction that stores its last rows, so a part is never stored twice.
ALTER TABLE job ADD COLUMN pass_id bigint REFERENCES pass ON DELETE CASCADE;
ALTER TABLE job ADD COLUMN part integer;
ALTER TABLE job DROP CONSTRAINT job_kind_check;
ALTER TABLE job ADD CONSTRAINT job_kind_check CHECK (kind IN ('ingest', 'statistics', 'statistics-part', 'ingest-part'));
ALTER TABLE job ADD CONSTRAINT job_part_of_pass CHECK ((kind LIKE '%-part') = (pass_id IS NOT NULL AND part IS NOT NULL));
CREATE INDEX job_pass_idx ON job (pass_id, part) WHERE pass_id IS NOT NULL;

-- Statistic blocks of a pass not yet finished: the columns of statistic_block, keyed by the pass first. Like
-- statistic_block it carries no foreign key to dataset (it can be distributed by block); DatasetStore.DeleteAsync
-- deletes its rows with the dataset's.
CREATE TABLE statistic_block_stage (
    pass_id      bigint NOT NULL,
    LIKE statistic_block INCLUDING DEFAULTS INCLUDING CONSTRAINTS INCLUDING STORAGE,
    PRIMARY KEY (pass_id, dataset_id, parameter, period, block)
);
