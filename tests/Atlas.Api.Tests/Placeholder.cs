namespace Atlas.Api.Tests; public class Placeholder { [Fact] public void Builds() { } }
