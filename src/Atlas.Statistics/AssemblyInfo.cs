namespace Atlas.Statistics;
