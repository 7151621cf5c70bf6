namespace Atlas.Hindcast.Tests; public class Placeholder { [Fact] public void Builds() { } }
