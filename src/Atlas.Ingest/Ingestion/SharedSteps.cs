namespace Atlas.Ingest.Ingestion;

/// <summary>
/// The time steps of one year given by more than one source: already stored, or in an earlier file of the same ingest
/// (monthly files whose last step is also the next file's first). For each step of each file it records who gave the
/// step before and with which variables, so that the loader compares the values instead of refusing the overlap: a
/// shared step with identical values is stored once, one with different values is a <see cref="SharedStepConflicts"/>.
/// </summary>
public sealed class SharedSteps
{
    /// <summary>No earlier source gives the step.</summary>
    public const int None = -1;

    /// <summary>The step is already stored in the dataset.</summary>
    public const int Stored = -2;

    private readonly int[][] _holder;
    private readonly int[][] _holderMask;

    private SharedSteps(int[][] holder, int[][] holderMask, int count)
    {
        _holder = holder;
        _holderMask = holderMask;
        Count = count;
    }

    /// <summary>Steps of the year that some file gives again (each counted once per repeat).</summary>
    public int Count { get; }

    /// <summary>
    /// Who gave step <paramref name="step"/> (an index into the file's steps of the year) of file
    /// <paramref name="file"/> before it: <see cref="None"/>, <see cref="Stored"/> or the index of an earlier file.
    /// </summary>
    public int HolderOf(int file, int step) => _holder[file][step];

    /// <summary>The stored-variable mask of that earlier source: only variables both have are compared.</summary>
    public int HolderMaskOf(int file, int step) => _holderMask[file][step];

    /// <param name="timeline">The year's merged time line.</param>
    /// <param name="stored">The year's stored time line, or null.</param>
    /// <param name="storedMask">Variables the stored series hold.</param>
    /// <param name="replaceStored">True when the request replaces stored steps: they are then not compared.</param>
    /// <param name="files">Per file, in load order: the time-line positions of its steps in the year and its variable mask.</param>
    public static SharedSteps ForYear(long[] timeline, long[]? stored, int storedMask, bool replaceStored, IReadOnlyList<(int[] Positions, int Mask)> files)
    {
        var holder = new int[timeline.Length];
        var mask = new int[timeline.Length];
        Array.Fill(holder, None);
        if (stored is not null && !replaceStored)
            foreach (var t in stored)
            {
                var at = Array.BinarySearch(timeline, t);
                holder[at] = Stored;
                mask[at] = storedMask;
            }
        var count = 0;
        var holders = new int[files.Count][];
        var masks = new int[files.Count][];
        for (var k = 0; k < files.Count; k++)
        {
            var (positions, fileMask) = files[k];
            holders[k] = new int[positions.Length];
            masks[k] = new int[positions.Length];
            for (var s = 0; s < positions.Length; s++)
            {
                var at = positions[s];
                holders[k][s] = holder[at];
                masks[k][s] = mask[at];
                if (holder[at] != None) count++;
                // The first source keeps naming the step: once values agree they are the same values.
                if (holder[at] == None) holder[at] = k;
                mask[at] |= fileMask;
            }
        }
        return new SharedSteps(holders, masks, count);
    }
}
