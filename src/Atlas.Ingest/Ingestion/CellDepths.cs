using Atlas.Hindcast;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The cell depths of an ingest: the depth of every file that has one, combined as the mean over all their valid
/// steps (a static depth counts one step per file), signs kept so that a sea floor above the surface can be told from
/// a missing depth.
/// </summary>
/// <param name="SignedMetres">Depth per cell, m, positive down; negative where the sea floor is above the surface; NaN where missing.</param>
/// <param name="Variable">The depth variable of the first file that has one.</param>
/// <param name="FileName">The first file that has a depth.</param>
/// <param name="Steps">Steps averaged (summed over files): the number of files for a static depth.</param>
/// <param name="TimeVarying">True when a file's depth varies with time.</param>
/// <param name="Files">Files that have a depth.</param>
public sealed record CellDepths(float[] SignedMetres, string Variable, string FileName, int Steps, bool TimeVarying, int Files)
{
    /// <summary>
    /// The depth the cells are stored with: positive, or null (unknown, or dry: at or above the surface). The land rule
    /// of <see cref="LandMask"/>.
    /// </summary>
    public float? StoredDepth(int cell) => SignedMetres[cell] > 0 ? SignedMetres[cell] : null;

    /// <summary>True where the sea floor is above the surface (a negative depth after sign handling).</summary>
    public bool IsNegative(int cell) => SignedMetres[cell] < 0;

    /// <summary>How the depth was taken, e.g. "time-varying, time mean of 744 steps used" or "static".</summary>
    public string Describe() => TimeVarying
        ? $"time-varying, time mean of {Steps:N0} steps{(Files > 1 ? $" over {Files} files" : "")} used"
        : "static";

    /// <summary>Reads and combines the depth of every file that has one; null when none has.</summary>
    public static CellDepths? Read(IReadOnlyList<SourceFile> files)
    {
        double[]? sum = null;
        int[]? valid = null;
        string? variable = null, fileName = null;
        int steps = 0, count = 0;
        bool timeVarying = false;
        foreach (var file in files)
        {
            if (!file.Has(WaveParameter.Depth)) continue;
            var field = file.File.ReadDepthField();
            file.Release();
            sum ??= new double[field.Metres.Length];
            valid ??= new int[field.Metres.Length];
            variable ??= file.Sources[WaveParameter.Depth].Name;
            fileName ??= file.Name;
            steps += field.Steps;
            timeVarying |= field.TimeVarying;
            count++;
            for (var p = 0; p < sum.Length; p++)
            {
                if (field.ValidSteps[p] == 0) continue;
                sum[p] += (double)field.Metres[p] * field.ValidSteps[p];
                valid[p] += field.ValidSteps[p];
            }
        }
        if (sum is null) return null;
        var mean = new float[sum.Length];
        for (var p = 0; p < mean.Length; p++) mean[p] = valid![p] > 0 ? (float)(sum[p] / valid[p]) : float.NaN;
        return new CellDepths(mean, variable!, fileName!, steps, timeVarying, count);
    }
}
