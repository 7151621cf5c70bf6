using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// A forward walk over the combined bins of several histograms on the same bins that estimates order statistics of
/// increasing rank (<see cref="FixedBinHistogram.EstimateQuantiles"/>): whole blocks are skipped on the parts' block
/// counts, and only the block that holds the rank is summed over the parts (<see cref="BlockCounts"/>) and walked bin
/// by bin. Inside a bin its values are taken as evenly spread across it; the overflow bin reaches to the maximum.
/// </summary>
internal ref struct OrderStatisticWalk
{
    private const int InBlock = FixedBinHistogram.BlockSize - 1;
    private readonly ReadOnlySpan<FixedBinHistogram> _parts;
    private readonly double _minimum, _maximum, _width;
    private readonly long _count;
    private readonly int _lastBin;
    private int _block;
    private long _beforeBlock, _blockCount;
    private int _bin;
    private long _beforeBin, _binCount;
    private BlockCounts _bins;

    /// <summary>A walk from the first bin of <paramref name="lowBlock"/>, the lowest block in use.</summary>
    public OrderStatisticWalk(ReadOnlySpan<FixedBinHistogram> parts, int lowBlock, long count, double minimum, double maximum)
    {
        _parts = parts;
        _count = count;
        _minimum = minimum;
        _maximum = maximum;
        _width = parts[0].Binning.BinWidth;
        _lastBin = parts[0].LastBin;
        _block = lowBlock;
        _beforeBlock = 0;
        _blockCount = BlockCount(lowBlock);
        _bin = lowBlock << FixedBinHistogram.BlockShift;
        _beforeBin = 0;
        _bins.Load(parts, lowBlock);
        _binCount = _bins[0];
    }

    /// <summary>Estimated value of the order statistic of 0-based rank (ranks must not decrease between calls).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public double Estimate(long rank)
    {
        // The extremes are known exactly.
        if (rank == 0) return _minimum;
        if (rank == _count - 1) return _maximum;
        if (rank >= _beforeBlock + _blockCount)
        {
            // Walked in locals (the walk's own fields live in memory beside its block of counts).
            long beforeBlock = _beforeBlock, blockCount = _blockCount;
            int block = _block;
            do
            {
                beforeBlock += blockCount;
                block++;
                blockCount = BlockCount(block);
            } while (rank >= beforeBlock + blockCount);
            (_beforeBlock, _blockCount, _block) = (beforeBlock, blockCount, block);
            _bin = block << FixedBinHistogram.BlockShift;
            _beforeBin = beforeBlock;
            _bins.Load(_parts, block);
            _binCount = _bins[0];
        }
        // The rank lies in this block, so the walk never leaves it.
        long beforeBin = _beforeBin, binCount = _binCount;
        int bin = _bin;
        while (rank >= beforeBin + binCount)
        {
            beforeBin += binCount;
            bin++;
            binCount = _bins[bin & InBlock];
        }
        (_beforeBin, _binCount, _bin) = (beforeBin, binCount, bin);
        double low = bin * _width;
        double high = bin == _lastBin ? Math.Max(_maximum, low) : low + _width;
        double value = low + (high - low) * ((rank - beforeBin) + 0.5) / binCount;
        return Math.Clamp(value, _minimum, _maximum);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private readonly long BlockCount(int block)
    {
        long count = 0;
        foreach (FixedBinHistogram part in _parts) count += part.Coarse[block];
        return count;
    }
}
