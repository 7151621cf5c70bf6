namespace Atlas.Demo.Tests; public class Placeholder { [Fact] public void Builds() { } }
