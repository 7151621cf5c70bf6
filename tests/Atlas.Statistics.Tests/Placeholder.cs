namespace Atlas.Statistics.Tests; public class Placeholder { [Fact] public void Builds() { } }
