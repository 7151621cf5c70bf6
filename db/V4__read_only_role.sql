-- The group role atlas_reader may read every table of the atlas schema and change none. The API's public read
-- endpoints connect as a login role that is a member of it (ATLAS_DB_READ); see deploy/OPERATIONS.md.
-- Roles are cluster-wide while this script runs once per database, possibly in several databases at the same time:
-- the role is created only when missing, and a concurrent creation elsewhere (duplicate_object, or unique_violation
-- when both inserts raced) counts as success. A migrating user without CREATEROLE gets a notice and no grants.
DO $$
BEGIN
    IF NOT EXISTS (SELECT 1 FROM pg_roles WHERE rolname = 'atlas_reader') THEN
        BEGIN
            CREATE ROLE atlas_reader NOLOGIN;
        EXCEPTION
            WHEN duplicate_object OR unique_violation THEN
                NULL;
            WHEN insufficient_privilege THEN
                RAISE NOTICE 'atlas: could not create the role atlas_reader (the migrating user lacks CREATEROLE); create it as a superuser with CREATE ROLE atlas_reader NOLOGIN and re-grant with the statements of V4__read_only_role.sql';
                RETURN;
        END;
    END IF;
    EXECUTE format('GRANT CONNECT ON DATABASE %I TO atlas_reader', current_database());
    GRANT USAGE ON SCHEMA public TO atlas_reader;
    GRANT SELECT ON ALL TABLES IN SCHEMA public TO atlas_reader;
    -- Tables added by later migrations (run by the same user) are readable too.
    ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT ON TABLES TO atlas_reader;
END
$$;
