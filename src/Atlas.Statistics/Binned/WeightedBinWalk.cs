using System.Runtime.CompilerServices;

namespace Atlas.Statistics.Binned;

/// <summary>
/// A forward walk over the weighted bins of several histograms on the same bins (see
/// <see cref="FixedBinHistogram.EstimateWeightedQuantiles"/>): whole blocks are skipped on the parts' weighted block
/// counts, and only the block that holds the sought weighted rank is summed over the parts (<see cref="BlockCounts"/>,
/// <see cref="BlockMasses"/>) and walked bin by bin.
/// </summary>
internal ref struct WeightedBinWalk
{
    private const int InBlock = FixedBinHistogram.BlockSize - 1;
    private readonly ReadOnlySpan<FixedBinHistogram> _parts;
    private readonly ReadOnlySpan<double> _weights;
    private readonly int _highBlock, _lastBin;
    private readonly double _width;
    private int _block, _bin, _index;
    private double _beforeBlock, _blockMass, _beforeBin, _binMass;
    private long _binCount;
    private BlockCounts _counts;
    private BlockMasses _masses;

    /// <summary>A walk from the first bin of <paramref name="lowBlock"/> over the blocks up to <paramref name="highBlock"/>.</summary>
    public WeightedBinWalk(ReadOnlySpan<FixedBinHistogram> parts, ReadOnlySpan<double> weights, int lowBlock, int highBlock)
    {
        _parts = parts;
        _weights = weights;
        _highBlock = highBlock;
        _lastBin = parts[0].LastBin;
        _width = parts[0].Binning.BinWidth;
        _block = lowBlock;
        _blockMass = BlockMass(lowBlock);
        _bin = lowBlock << FixedBinHistogram.BlockShift;
        LoadBlock();
        LoadBin();
    }

    /// <summary>The estimated value whose weighted rank is at or below the target, the next one's fraction of the way.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public (double Value, double Fraction) Estimate(double target)
    {
        if (target >= _beforeBlock + _blockMass)
        {
            // Walked in locals (the walk's own fields live in memory beside its block of counts).
            double beforeBlock = _beforeBlock, blockMass = _blockMass;
            int block = _block;
            while (target >= beforeBlock + blockMass && block < _highBlock)
            {
                beforeBlock += blockMass;
                block++;
                blockMass = BlockMass(block);
            }
            (_beforeBlock, _blockMass, _block) = (beforeBlock, blockMass, block);
            _bin = block << FixedBinHistogram.BlockShift;
            _beforeBin = beforeBlock;
            LoadBlock();
            LoadBin();
        }
        // Bins are walked within the block (up to the overflow bin).
        double beforeBin = _beforeBin, binMass = _binMass;
        long binCount = _binCount;
        int bin = _bin, end = Math.Min((_block + 1) << FixedBinHistogram.BlockShift, _lastBin + 1) - 1;
        while ((target >= beforeBin + binMass || binCount == 0) && bin < end)
        {
            beforeBin += binMass;
            bin++;
            binMass = _masses[bin & InBlock];
            binCount = _counts[bin & InBlock];
        }
        (_beforeBin, _binMass, _binCount, _bin) = (beforeBin, binMass, binCount, bin);
        double each = binMass / Math.Max(binCount, 1);
        double position = each > 0 ? (target - beforeBin) / each : 0;
        _index = (int)Math.Clamp(Math.Floor(position), 0, Math.Max(binCount - 1, 0));
        return (ValueAt(bin, _index, binCount), Math.Clamp(position - _index, 0, 1));
    }

    /// <summary>The estimated value after the last one estimated (in the same bin, or the first of the next bin with values).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public readonly double EstimateNext()
    {
        if (_index + 1 < _binCount) return ValueAt(_bin, _index + 1, _binCount);
        int last = Math.Min(((_highBlock + 1) << FixedBinHistogram.BlockShift) - 1, _lastBin);
        int blockEnd = (_block + 1) << FixedBinHistogram.BlockShift;
        for (int bin = _bin + 1; bin <= last; bin++)
        {
            long c = 0;
            if (bin < blockEnd) c = _counts[bin & InBlock];
            else foreach (FixedBinHistogram part in _parts) c += part.Fine[bin];
            if (c > 0) return ValueAt(bin, 0, c);
        }
        return ValueAt(_bin, _index, _binCount);
    }

    private readonly double ValueAt(int bin, long index, long binCount)
    {
        // The overflow bin's values lie between the bound and the maximum; the caller's clamp keeps them below it.
        return bin * _width + _width * (index + 0.5) / Math.Max(binCount, 1);
    }

    private void LoadBlock()
    {
        _counts.Load(_parts, _block);
        _masses.Load(_parts, _weights, _block);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void LoadBin()
    {
        _binMass = _masses[_bin & InBlock];
        _binCount = _counts[_bin & InBlock];
    }

    /// <summary>Sum over the parts i, in order, of w_i times the block count of part i.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private readonly double BlockMass(int block)
    {
        double mass = 0;
        for (int i = 0; i < _parts.Length; i++) mass += _weights[i] * _parts[i].Coarse[block];
        return mass;
    }
}
