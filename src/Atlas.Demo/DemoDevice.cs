namespace Atlas.Demo;

/// <summary>The invented wave-energy converter of the demo.</summary>
/// <param name="Name">Device name.</param>
/// <param name="Kind">Kind of converter.</param>
/// <param name="RatedKilowatts">Rated electrical power, kW.</param>
/// <param name="FileName">Name of its power-matrix file (CSV).</param>
public sealed record DemoDevice(string Name, string Kind, double RatedKilowatts, string FileName);
