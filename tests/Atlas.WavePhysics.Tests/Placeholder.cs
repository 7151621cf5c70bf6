namespace Atlas.WavePhysics.Tests; public class Placeholder { [Fact] public void Builds() { } }
