namespace Atlas.Storage.Tests; public class Placeholder { [Fact] public void Builds() { } }
