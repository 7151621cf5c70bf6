-- The per-step values of output points as packed little-endian 32-bit floats (bytea, 4 bytes a step) instead of real[]:
-- PostgreSQL parsed and checked every element of every array a COPY brought (half its time in the last step of an
-- ingest of 50 stations x 10 years), and the binary COPY form of real[] is twice the size (a length before each value).
-- Stored out of line without compression (float noise does not compress; the attempt only cost time).
CREATE FUNCTION atlas_v10_float4_le(a real[]) RETURNS bytea LANGUAGE sql IMMUTABLE AS $$
    SELECT coalesce(string_agg(substring(b FROM 4 FOR 1) || substring(b FROM 3 FOR 1) || substring(b FROM 2 FOR 1) || substring(b FROM 1 FOR 1),
                               ''::bytea ORDER BY i), ''::bytea)
      FROM unnest(a) WITH ORDINALITY AS u(x, i), LATERAL float4send(x) AS b
$$;

ALTER TABLE station_step
    ALTER COLUMN j_spectral TYPE bytea USING atlas_v10_float4_le(j_spectral),
    ALTER COLUMN j_parametric TYPE bytea USING atlas_v10_float4_le(j_parametric),
    ALTER COLUMN directionality TYPE bytea USING atlas_v10_float4_le(directionality),
    ALTER COLUMN max_power_from TYPE bytea USING atlas_v10_float4_le(max_power_from),
    ALTER COLUMN spectral_width TYPE bytea USING atlas_v10_float4_le(spectral_width);

ALTER TABLE station_step
    ALTER COLUMN j_spectral SET STORAGE EXTERNAL,
    ALTER COLUMN j_parametric SET STORAGE EXTERNAL,
    ALTER COLUMN directionality SET STORAGE EXTERNAL,
    ALTER COLUMN max_power_from SET STORAGE EXTERNAL,
    ALTER COLUMN spectral_width SET STORAGE EXTERNAL;

DROP FUNCTION atlas_v10_float4_le(real[]);
