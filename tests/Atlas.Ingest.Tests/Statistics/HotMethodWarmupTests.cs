using Atlas.Ingest.Statistics;

namespace Atlas.Ingest.Tests.Statistics;

public class HotMethodWarmupTests
{
    // Every method the statistics pass marks for full optimisation compiles ahead of its use: none throws (which would
    // end the warm-up early), and each assembly has the marked methods the warm-up is for.
    [Fact]
    public void ThePassesFullyOptimisedMethodsAllCompile()
    {
        Assert.True(HotMethodWarmup.Prepare(typeof(Atlas.Statistics.Binned.BinnedCellCalculator).Assembly) >= 20);
        Assert.True(HotMethodWarmup.Prepare(typeof(Atlas.WavePhysics.WavePower).Assembly) >= 1);
        Assert.True(HotMethodWarmup.Prepare(typeof(Atlas.Storage.Series.SeriesCodec).Assembly) >= 5);
        Assert.True(HotMethodWarmup.Prepare(typeof(HotMethodWarmup).Assembly) >= 5);
    }
}
