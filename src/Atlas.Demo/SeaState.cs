namespace Atlas.Demo;

/// <summary>A bulk sea state at one cell and instant.</summary>
/// <param name="Hs">Significant wave height Hm0, m.</param>
/// <param name="Te">Energy period Tm-1,0, s.</param>
/// <param name="Tp">Peak period, s.</param>
/// <param name="FromDegrees">Mean direction the waves come from, degrees true, [0, 360).</param>
/// <param name="SpreadDegrees">Directional spread, degrees.</param>
public readonly record struct SeaState(double Hs, double Te, double Tp, double FromDegrees, double SpreadDegrees);
