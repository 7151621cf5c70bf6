namespace Atlas.Statistics;

/// <summary>
/// Exact statistics of the full series at one point, for the point endpoints: the same period summaries as the
/// layer pass but with exact percentiles, plus exceedance curves, the joint Hm0-Te occurrence table and inter-annual
/// variability, optionally restricted to a window of years and months.
/// </summary>
/// <remarks>
/// Each parameter's valid steps inside the window are sorted once (a radix sort, with their (year, month) slot) and dealt out,
/// still sorted, to every period they belong to; percentiles are then read exactly under the chosen
/// <see cref="QuantileDefinition"/>, means are sums in double, standard deviations the population ones.
/// Te, power and the directionality coefficient are derived per step exactly as in the layer pass
/// (<see cref="CellStatisticsCalculator"/>), so the two agree except for the histogram percentiles.
/// </remarks>
public static class PointAnalysis
{
    private const int ParallelSortSteps = 50_000;
    private static readonly AtlasPeriod[] InterAnnualPeriods = [AtlasPeriod.Annual, AtlasPeriod.Djf, AtlasPeriod.Mam, AtlasPeriod.Jja, AtlasPeriod.Son];

    /// <summary>Analyses one point.</summary>
    /// <param name="series">The point's series on its timeline.</param>
    /// <param name="options">Settings; the defaults when null.</param>
    /// <returns>Results that serialise to JSON without NaN (missing values are null).</returns>
    /// <exception cref="ArgumentException">The series or a setting is not usable; the message names it.</exception>
    public static PointAnalysisResult Analyse(in CellSeries series, PointAnalysisOptions? options = null)
    {
        options ??= new PointAnalysisOptions();
        options.Validate();
        series.Validate();
        StatisticsOptions settings = options.Statistics;
        var calendar = new TimelineCalendar(series.Times);
        var window = new WindowedPeriods(calendar, options.Window);
        DerivedSeries derived = new DerivedSeriesBuffers().Derive(series, settings);
        bool hasPower = derived.Power.Length > 0;
        QuantileDefinition definition = options.QuantileDefinition;

        long[]?[] packed =
        [
            window.Pack(series.Hs, WaveParameter.Hs), window.Pack(derived.Te, WaveParameter.Te), window.Pack(series.Tp, WaveParameter.Tp),
            window.Pack(derived.Power, WaveParameter.J), window.Pack(series.Spread, WaveParameter.Spread),
            window.Pack(derived.Directionality, WaveParameter.D),
        ];
        var sortedParameters = new double[][]?[packed.Length];
        var summaries = new SummaryStatistics[packed.Length][];
        void SortAndSummarise(int k)
        {
            double[][]? sorted = sortedParameters[k] = window.SortedPerPeriod(packed[k]);
            summaries[k] = new SummaryStatistics[window.Periods.Count];
            for (int i = 0; i < summaries[k].Length; i++)
                summaries[k][i] = sorted is null ? SummaryStatistics.Empty : ExactSummary.Of(sorted[i], window.Periods[i].Expected, definition);
        }
        // A long series (decades of hourly steps) sorts and summarises its parameters on every core; a short one is
        // not worth the hand-off.
        if (series.Times.Length >= ParallelSortSteps) Parallel.For(0, packed.Length, SortAndSummarise);
        else for (int k = 0; k < packed.Length; k++) SortAndSummarise(k);
        double[][]? hs = sortedParameters[0], power = sortedParameters[3];

        var direction = new DirectionAccumulator();
        if (series.Dir.Length > 0 && hasPower)
        {
            direction.Prepare(calendar);
            direction.Accumulate(series.Dir, derived.Power);
        }

        var periods = new PeriodStatistics[window.Periods.Count];
        for (int i = 0; i < periods.Length; i++)
        {
            (AtlasPeriod period, int[] slots, long expected) = window.Periods[i];
            SummaryStatistics hsSummary = summaries[0][i], powerSummary = summaries[3][i];
            periods[i] = new PeriodStatistics(
                period, expected, hsSummary, summaries[1][i], summaries[2][i], powerSummary, summaries[4][i], summaries[5][i],
                direction.Summarise(slots, expected),
                Exceedances(hs?[i], settings.HsThresholdsMetres),
                Exceedances(power?[i], settings.PowerThresholdsKilowattsPerMetre),
                (hasPower ? powerSummary.Coverage : hsSummary.Coverage) < settings.LowCoverageThreshold);
        }

        int annual = window.IndexOf(AtlasPeriod.Annual);
        return new PointAnalysisResult(
            series.DepthMetres,
            derived.DeepWaterAssumed,
            derived.EnergyPeriodSource,
            definition,
            options.Window,
            window.StepsInWindow,
            periods,
            Curve(WaveParameter.Hs, annual < 0 ? null : hs?[annual], options.HsCurveStepMetres),
            Curve(WaveParameter.J, annual < 0 ? null : power?[annual], options.PowerCurveStepKilowattsPerMetre),
            JointOccurrence(series.Hs, derived.Te, derived.Power, window, options),
            InterAnnual(series.Hs, derived.Te, derived.Power, window, settings.LowCoverageThreshold));
    }

    private static ExceedanceFraction[] Exceedances(double[]? sorted, IReadOnlyList<double> thresholds)
    {
        var result = new ExceedanceFraction[thresholds.Count];
        for (int t = 0; t < result.Length; t++)
        {
            double fraction = sorted is { Length: > 0 } ? (double)ExactSummary.CountAbove(sorted, thresholds[t]) / sorted.Length : double.NaN;
            result[t] = new ExceedanceFraction(thresholds[t], fraction);
        }
        return result;
    }

    private static ExceedanceCurve Curve(WaveParameter parameter, double[]? sorted, double step)
    {
        if (sorted is not { Length: > 0 }) return new ExceedanceCurve(parameter, step, [], [], 0);
        int points = (int)Math.Ceiling(sorted[^1] / step) + 1;
        var thresholds = new double[points];
        var fractions = new double[points];
        for (int k = 0; k < points; k++)
        {
            thresholds[k] = k * step;
            fractions[k] = (double)ExactSummary.CountAbove(sorted, thresholds[k]) / sorted.Length;
        }
        return new ExceedanceCurve(parameter, step, thresholds, fractions, sorted.Length);
    }

    private static JointOccurrenceTable JointOccurrence(ReadOnlySpan<float> hs, ReadOnlySpan<float> te, ReadOnlySpan<float> power,
        WindowedPeriods window, PointAnalysisOptions options)
    {
        double hsBin = options.JointHsBinMetres, teBin = options.JointTeBinSeconds;
        int rows = 0, firstColumn = int.MaxValue, lastColumn = -1;
        long total = 0;
        ReadOnlySpan<int> stepSlots = window.Calendar.StepSlots;
        for (int i = 0; i < power.Length; i++)
        {
            if (!window.Includes(stepSlots[i]) || !ParameterValidity.IsValid(WaveParameter.J, power[i])) continue;
            rows = Math.Max(rows, (int)(hs[i] / hsBin) + 1);
            int column = (int)(te[i] / teBin);
            firstColumn = Math.Min(firstColumn, column);
            lastColumn = Math.Max(lastColumn, column);
            total++;
        }
        if (total == 0) return new JointOccurrenceTable(hsBin, teBin, [], [], [], [], [], [], 0);

        int columns = lastColumn - firstColumn + 1;
        var counts = new long[rows][];
        var energy = new double[rows][];
        for (int r = 0; r < rows; r++) { counts[r] = new long[columns]; energy[r] = new double[columns]; }
        double totalEnergy = 0;
        for (int i = 0; i < power.Length; i++)
        {
            if (!window.Includes(stepSlots[i]) || !ParameterValidity.IsValid(WaveParameter.J, power[i])) continue;
            int r = (int)(hs[i] / hsBin), c = (int)(te[i] / teBin) - firstColumn;
            counts[r][c]++;
            energy[r][c] += power[i];
            totalEnergy += power[i];
        }

        var fractionOfTime = new double[rows][];
        var meanPower = new double?[rows][];
        var fractionOfEnergy = new double[rows][];
        for (int r = 0; r < rows; r++)
        {
            fractionOfTime[r] = new double[columns];
            meanPower[r] = new double?[columns];
            fractionOfEnergy[r] = new double[columns];
            for (int c = 0; c < columns; c++)
            {
                fractionOfTime[r][c] = (double)counts[r][c] / total;
                meanPower[r][c] = counts[r][c] > 0 ? energy[r][c] / counts[r][c] : null;
                fractionOfEnergy[r][c] = totalEnergy > 0 ? energy[r][c] / totalEnergy : 0;
            }
        }
        return new JointOccurrenceTable(hsBin, teBin,
            [.. Enumerable.Range(0, rows).Select(r => r * hsBin)],
            [.. Enumerable.Range(firstColumn, columns).Select(c => c * teBin)],
            counts, fractionOfTime, meanPower, fractionOfEnergy, total);
    }

    private static InterAnnualSeries[] InterAnnual(ReadOnlySpan<float> hs, ReadOnlySpan<float> te, ReadOnlySpan<float> power,
        WindowedPeriods window, double lowCoverageThreshold)
    {
        TimelineCalendar calendar = window.Calendar;
        SlotSums hsSums = SlotSums.Of(hs, WaveParameter.Hs, window), teSums = SlotSums.Of(te, WaveParameter.Te, window),
                 powerSums = SlotSums.Of(power, WaveParameter.J, window);
        bool hasPower = power.Length > 0;
        var result = new List<InterAnnualSeries>();
        foreach (AtlasPeriod period in InterAnnualPeriods)
        {
            var years = new List<YearlyMeans>();
            foreach (int year in calendar.Years)
            {
                long expected = 0;
                var slots = new List<int>();
                foreach (int month in period.Months)
                {
                    int slot = calendar.SlotOf(year, month);
                    if (!window.Includes(slot)) continue;
                    slots.Add(slot);
                    expected += calendar.StepsInSlot(slot);
                }
                if (expected == 0) continue;
                (double hsMean, long hsCount) = hsSums.Mean(slots);
                (double teMean, _) = teSums.Mean(slots);
                (double powerMean, long powerCount) = powerSums.Mean(slots);
                double coverage = (double)(hasPower ? powerCount : hsCount) / expected;
                years.Add(new YearlyMeans(year, hsMean, teMean, powerMean, coverage, coverage < lowCoverageThreshold));
            }
            if (years.Count == 0) continue;
            YearlyMeans[] used = [.. years.Where(y => !y.LowCoverage)];
            result.Add(new InterAnnualSeries(period, years, used.Length,
                CoefficientOfVariation(used.Select(y => y.Hs)),
                CoefficientOfVariation(used.Select(y => y.Te)),
                CoefficientOfVariation(used.Select(y => y.J))));
        }
        return [.. result];
    }

    private static double CoefficientOfVariation(IEnumerable<double> values)
    {
        var moments = new RunningMoments();
        foreach (double v in values)
            if (!double.IsNaN(v)) moments.Add(v);
        return moments.SampleStandardDeviation / moments.Mean;
    }

    /// <summary>Count and double sum of valid steps per slot, inside the window.</summary>
    private sealed class SlotSums
    {
        private readonly long[] _counts;
        private readonly double[] _sums;

        private SlotSums(int slots)
        {
            _counts = new long[slots];
            _sums = new double[slots];
        }

        public static SlotSums Of(ReadOnlySpan<float> values, WaveParameter parameter, WindowedPeriods window)
        {
            var sums = new SlotSums(window.Calendar.SlotCount);
            ReadOnlySpan<int> stepSlots = window.Calendar.StepSlots;
            for (int i = 0; i < values.Length; i++)
            {
                int slot = stepSlots[i];
                if (!window.Includes(slot) || !ParameterValidity.IsValid(parameter, values[i])) continue;
                sums._counts[slot]++;
                sums._sums[slot] += values[i];
            }
            return sums;
        }

        public (double Mean, long Count) Mean(List<int> slots)
        {
            long n = 0;
            double sum = 0;
            foreach (int s in slots) { n += _counts[s]; sum += _sums[s]; }
            return (n > 0 ? sum / n : double.NaN, n);
        }
    }

    /// <summary>The periods present in the window, the slots of each, and the sorted values of a parameter per period.</summary>
    private sealed class WindowedPeriods
    {
        private readonly bool[] _included;
        // The periods a slot belongs to (its month, season, the whole window and its year: at most four), in rows of four.
        private const int MaxPeriodsPerSlot = 4;
        private readonly int[] _periodsOfSlot;
        private readonly int[] _periodCountOfSlot;

        public WindowedPeriods(TimelineCalendar calendar, AnalysisWindow? window)
        {
            Calendar = calendar;
            _included = new bool[calendar.SlotCount];
            for (int s = 0; s < _included.Length; s++)
            {
                _included[s] = calendar.StepsInSlot(s) > 0 && (window?.Contains(calendar.YearOfSlot(s), TimelineCalendar.MonthOfSlot(s)) ?? true);
                if (_included[s]) StepsInWindow += calendar.StepsInSlot(s);
            }

            var periods = new List<(AtlasPeriod, int[], long)>();
            var periodsOfSlot = new List<int>[calendar.SlotCount];
            for (int s = 0; s < periodsOfSlot.Length; s++) periodsOfSlot[s] = [];
            foreach (AtlasPeriod period in calendar.PeriodsPresent)
            {
                int[] slots = [.. calendar.SlotsOf(period).ToArray().Where(s => _included[s])];
                if (slots.Length == 0) continue;
                long expected = slots.Sum(calendar.StepsInSlot);
                foreach (int s in slots) periodsOfSlot[s].Add(periods.Count);
                periods.Add((period, slots, expected));
            }
            Periods = periods;
            _periodsOfSlot = new int[MaxPeriodsPerSlot * calendar.SlotCount];
            _periodCountOfSlot = new int[calendar.SlotCount];
            for (int s = 0; s < periodsOfSlot.Length; s++)
            {
                if (periodsOfSlot[s].Count > MaxPeriodsPerSlot)
                    throw new InvalidOperationException($"A calendar slot belongs to {periodsOfSlot[s].Count} periods; at most {MaxPeriodsPerSlot} were expected.");
                periodsOfSlot[s].CopyTo(_periodsOfSlot, MaxPeriodsPerSlot * s);
                _periodCountOfSlot[s] = periodsOfSlot[s].Count;
            }
        }

        public TimelineCalendar Calendar { get; }

        public long StepsInWindow { get; }

        public IReadOnlyList<(AtlasPeriod Period, int[] Slots, long Expected)> Periods { get; }

        public bool Includes(int slot) => _included[slot];

        public int IndexOf(AtlasPeriod period)
        {
            for (int i = 0; i < Periods.Count; i++) if (Periods[i].Period == period) return i;
            return -1;
        }

        /// <summary>
        /// The valid values inside the window, each packed into one 64-bit key with its slot (value bits above, slot
        /// below); null when the series is absent.
        /// </summary>
        /// <remarks>
        /// Every parameter sorted here is non-negative, and the bits of a non-negative float order like the float, so
        /// sorting the keys by their upper half orders the values and carries their slots along.
        /// </remarks>
        public long[]? Pack(ReadOnlySpan<float> values, WaveParameter parameter)
        {
            if (values.Length == 0) return null;
            ReadOnlySpan<int> stepSlots = Calendar.StepSlots;
            int valid = 0;
            for (int i = 0; i < values.Length; i++)
                if (_included[stepSlots[i]] && ParameterValidity.IsValid(parameter, values[i])) valid++;
            var packed = new long[valid];
            for (int i = 0, k = 0; i < values.Length; i++)
            {
                if (!_included[stepSlots[i]] || !ParameterValidity.IsValid(parameter, values[i])) continue;
                float value = values[i] + 0f; // -0 becomes +0, whose bits sort first
                packed[k++] = (long)BitConverter.SingleToInt32Bits(value) << 32 | (uint)stepSlots[i];
            }
            return packed;
        }

        /// <summary>The packed values sorted and dealt out, still sorted, to every period they belong to; null when absent.</summary>
        public double[][]? SortedPerPeriod(long[]? packed)
        {
            if (packed is null) return null;
            ValueRadixSort.SortByUpperHalf(packed);
            // Per period: the count of its steps, from the steps per slot.
            var slotCounts = new int[_periodCountOfSlot.Length];
            foreach (long key in packed) slotCounts[(int)(key & 0xFFFF_FFFF)]++;
            var counts = new int[Periods.Count];
            for (int s = 0; s < slotCounts.Length; s++)
                for (int k = 0; k < _periodCountOfSlot[s]; k++) counts[_periodsOfSlot[MaxPeriodsPerSlot * s + k]] += slotCounts[s];
            var sorted = new double[Periods.Count][];
            for (int p = 0; p < sorted.Length; p++) sorted[p] = GC.AllocateUninitializedArray<double>(counts[p]);
            Array.Clear(counts);
            foreach (long key in packed)
            {
                double value = BitConverter.Int32BitsToSingle((int)(key >> 32));
                int slot = (int)(key & 0xFFFF_FFFF), row = MaxPeriodsPerSlot * slot;
                for (int k = 0; k < _periodCountOfSlot[slot]; k++)
                {
                    int p = _periodsOfSlot[row + k];
                    sorted[p][counts[p]++] = value;
                }
            }
            return sorted;
        }
    }
}
