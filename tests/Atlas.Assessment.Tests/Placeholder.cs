namespace Atlas.Assessment.Tests; public class Placeholder { [Fact] public void Builds() { } }
