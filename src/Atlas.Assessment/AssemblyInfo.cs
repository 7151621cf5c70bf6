namespace Atlas.Assessment;
