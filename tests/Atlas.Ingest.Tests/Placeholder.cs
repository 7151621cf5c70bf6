namespace Atlas.Ingest.Tests; public class Placeholder { [Fact] public void Builds() { } }
