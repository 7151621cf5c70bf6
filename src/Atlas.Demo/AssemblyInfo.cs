namespace Atlas.Demo;
