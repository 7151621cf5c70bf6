namespace Atlas.Ingest;
