namespace Atlas.Cli.Tests; public class Placeholder { [Fact] public void Builds() { } }
