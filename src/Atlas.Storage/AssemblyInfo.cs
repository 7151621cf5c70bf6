namespace Atlas.Storage;
