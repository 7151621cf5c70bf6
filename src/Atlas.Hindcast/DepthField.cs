namespace Atlas.Hindcast;

/// <summary>
/// The water depth of every point of a file as decoded (metres, positive down, signs handled), before any land rule:
/// a negative value is kept so that the ingest can tell a sea floor above the surface from a missing depth.
/// </summary>
/// <param name="Metres">Depth per point; the time mean of the valid steps when the depth varies in time; NaN where
/// the file gives no value at any step.</param>
/// <param name="ValidSteps">Steps averaged at each point (1 for a static depth with a value, 0 where NaN).</param>
/// <param name="Steps">Steps of the file's depth variable: 1 when it is static.</param>
/// <param name="TimeVarying">True when the depth variable has the time dimension.</param>
public sealed record DepthField(float[] Metres, int[] ValidSteps, int Steps, bool TimeVarying);
