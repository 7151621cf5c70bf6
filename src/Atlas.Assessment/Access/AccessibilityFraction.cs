namespace Atlas.Assessment.Access;

/// <summary>Share of non-missing time within the access limits.</summary>
/// <param name="CalmSteps">Steps within all limits.</param>
/// <param name="ValidSteps">Steps with every limited variable present.</param>
public sealed record AccessibilityFraction(int CalmSteps, int ValidSteps)
{
    /// <summary>CalmSteps / ValidSteps; NaN when no step is valid.</summary>
    public double Fraction => ValidSteps > 0 ? (double)CalmSteps / ValidSteps : double.NaN;
}
