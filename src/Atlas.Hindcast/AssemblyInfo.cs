namespace Atlas.Hindcast;
