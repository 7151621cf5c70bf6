namespace Atlas.WavePhysics;

/// <summary>The largest directionally resolved power of a sea state and the direction it is resolved in.</summary>
/// <param name="OmnidirectionalPower">J, kW/m (or the unit of the component powers given).</param>
/// <param name="MaximumResolvedPower">J_theta at its largest: the power crossing a line normal to theta from one side.</param>
/// <param name="DirectionOfMaximumDegrees">theta of the largest J_theta, degrees 0..360 in the convention of the input directions.</param>
/// <param name="Coefficient">d = J_theta,max / J, 0..1.</param>
public readonly record struct DirectionalPower(
    double OmnidirectionalPower,
    double MaximumResolvedPower,
    double DirectionOfMaximumDegrees,
    double Coefficient);
