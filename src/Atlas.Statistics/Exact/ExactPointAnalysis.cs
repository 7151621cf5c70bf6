using System.Buffers;
using System.Collections.Concurrent;

namespace Atlas.Statistics.Exact;

/// <summary>
/// Exact statistics of the full series at one point, for the point endpoints: the same period summaries as the
/// layer pass but with exact percentiles, plus exceedance curves, the joint Hm0-Te occurrence table and inter-annual
/// variability, optionally restricted to a window of years and months.
/// </summary>
/// <remarks>
/// Each parameter's valid steps inside the window are sorted once (a radix sort, with their (year, month) slot) and dealt out,
/// still sorted, to every period they belong to; percentiles are then read exactly under the chosen
/// <see cref="QuantileDefinition"/>, means are sums in double, standard deviations the population ones.
/// Te and power are derived per step exactly as in the layer pass (<see cref="BinnedCellCalculator"/>), and the
/// seasons and the window's whole span (annual) are month-balanced the same way (<see cref="MonthBalance"/>, with the
/// weighted quantiles of <see cref="BalancedValues"/>), so the two agree except for the histogram percentiles. The
/// directionality coefficient of a period comes from the period-mean directionally resolved power
/// (<see cref="DirectionalityAccumulator"/>). Coverage is calendar-true: the window's months of the record's years
/// expect their calendar length over the nominal step, with steps or without.
/// </remarks>
public static class ExactPointAnalysis
{
    private const int ParallelSteps = 50_000;
    private const int JointTask = 5, DirectionTask = 6;
    // The sorts of the parameters every dataset has (power, Hs, Te) first, then the joint table, then the sorts of
    // the often absent ones and the direction sums: the longest work starts first and the cores finish together.
    private static readonly int[] TaskOrder = [3, 0, 1, JointTask, 2, 4, DirectionTask];
    private static readonly AtlasPeriod[] InterAnnualPeriods = [AtlasPeriod.Annual, AtlasPeriod.Djf, AtlasPeriod.Mam, AtlasPeriod.Jja, AtlasPeriod.Son];

    /// <summary>Analyses one point.</summary>
    /// <param name="series">The point's series on its timeline.</param>
    /// <param name="options">Settings; the defaults when null.</param>
    /// <param name="calendar">
    /// The calendar of an earlier analysis, used again when it is the calendar of the same timeline (built afresh
    /// otherwise): cells of a dataset share their timeline, and building it costs a pass over every step.
    /// </param>
    /// <returns>Results that serialise to JSON without NaN (missing values are null).</returns>
    /// <exception cref="ArgumentException">The series or a setting is not usable; the message names it.</exception>
    public static ExactPointStatistics Analyse(in CellSeries series, ExactPointOptions? options = null, TimelineCalendar? calendar = null) =>
        Analyse(series, options, calendar, series.Times.Length >= ParallelSteps);

    /// <summary>As the public overload; <paramref name="parallel"/> chooses between every core and the calling thread alone.</summary>
    internal static ExactPointStatistics Analyse(in CellSeries series, ExactPointOptions? options, TimelineCalendar? calendar, bool parallel)
    {
        options ??= new ExactPointOptions();
        options.Validate();
        series.Validate();
        StatisticsOptions settings = options.Statistics;
        if (calendar is null || !calendar.HasTimes(series.Times)) calendar = new TimelineCalendar(series.Times);
        var window = new WindowedPeriods(calendar, options.Window);
        using var buffers = new DerivedSeriesBuffers(ArrayPool<float>.Shared);
        DerivedSeries derived = buffers.Derive(series, settings);
        bool hasPower = derived.Power.Length > 0;
        QuantileDefinition definition = options.QuantileDefinition;
        ExactParts parts = options.Parts;
        bool others = parts.HasFlag(ExactParts.OtherSummaries), curvesAsked = parts.HasFlag(ExactParts.ExceedanceCurves);
        bool jointAsked = parts.HasFlag(ExactParts.JointOccurrence), interAnnualAsked = parts.HasFlag(ExactParts.InterAnnual);

        int n = series.Times.Length;
        using var columns = new RentedColumns();
        // Only the columns some asked part reads are copied: Hs and Te for their summaries, the joint table and the
        // yearly means (Hs also for the coverage of a series without power), the direction and spread for directions.
        bool hsNeeded = others || jointAsked || interAnnualAsked || !hasPower, teNeeded = others || jointAsked || interAnnualAsked;
        bool directionsAsked = parts.HasFlag(ExactParts.Directions);
        float[]?[] values =
        [
            hsNeeded ? columns.Copy(series.Hs) : null, teNeeded ? columns.Copy(derived.Te) : null, others ? columns.Copy(series.Tp) : null,
            columns.Copy(derived.Power), others || directionsAsked ? columns.Copy(series.Spread) : null,
        ];
        float[]? directions = hasPower && directionsAsked ? columns.Copy(series.Dir) : null;
        WaveParameter[] parameters = [WaveParameter.Hs, WaveParameter.Te, WaveParameter.Tp, WaveParameter.J, WaveParameter.Spread];
        const int hsIndex = 0, teIndex = 1, powerIndex = 3, spreadIndex = 4;
        // Hs, Te and J are also summed per slot while they are packed, for the inter-annual means.
        var sums = new SlotSums?[values.Length];
        if (interAnnualAsked)
        {
            sums[hsIndex] = new SlotSums(calendar.SlotCount);
            sums[teIndex] = new SlotSums(calendar.SlotCount);
            sums[powerIndex] = new SlotSums(calendar.SlotCount);
        }
        // The summaries of a parameter are made when asked for, and always for J (and for Hs when there is no power:
        // its coverage is the period's).
        bool Summarised(int task) => task == powerIndex || others || (task == hsIndex && !hasPower);

        var sorted = new SortedPeriodValues?[values.Length];
        var summaries = new SummaryStatistics[values.Length][];
        var exceedances = new ExceedanceFraction[values.Length][][];
        var curves = new ExceedanceCurve?[values.Length];
        int annual = window.IndexOf(AtlasPeriod.Annual);
        JointOccurrenceTable? joint = null;
        var direction = new DirectionAccumulator();
        var directionality = new DirectionalityAccumulator();
        float[]? spreads = values[spreadIndex];
        void Run(int task)
        {
            if (task < values.Length)
            {
                float[]? v = values[task];
                if (!Summarised(task))
                {
                    // Not asked for: no summaries, but still the yearly sums when those are.
                    if (v is not null && sums[task] is { } slotSums) window.SumPerSlot(v.AsSpan(0, n), parameters[task], slotSums);
                    summaries[task] = [.. window.Periods.Select(_ => SummaryStatistics.Empty)];
                    exceedances[task] = new ExceedanceFraction[window.Periods.Count][];
                    return;
                }
                SortedPeriodValues? s = sorted[task] = v is null ? null : window.SortPerPeriod(v.AsSpan(0, n), parameters[task], sums[task]);
                (IReadOnlyList<double>? thresholds, double curveStep) = task switch
                {
                    hsIndex => (settings.HsThresholdsMetres, options.HsCurveStepMetres),
                    powerIndex => (settings.PowerThresholdsKilowattsPerMetre, options.PowerCurveStepKilowattsPerMetre),
                    _ => ((IReadOnlyList<double>?)null, 0.0),
                };
                summaries[task] = new SummaryStatistics[window.Periods.Count];
                exceedances[task] = new ExceedanceFraction[window.Periods.Count][];
                for (int i = 0; i < summaries[task].Length; i++)
                {
                    WindowPeriod period = window.Periods[i];
                    using BalancedValues? balanced = s is null || !MonthBalance.Applies(period.Period) ? null
                        : BalancedValues.TryCreate(s.MemoryOf(i), s.MonthsOf(i), s.MonthCountsOf(i), period.ExpectedByMonth);
                    summaries[task][i] = s is null ? SummaryStatistics.Empty
                        : balanced?.Summary(period.Expected, definition) ?? ExactSummary.Of(s.Of(i), period.Expected, definition);
                    if (thresholds is null) continue;
                    exceedances[task][i] = Exceedances(s, i, balanced, thresholds);
                    if (i == annual && curvesAsked)
                        curves[task] = Curve(parameters[task], s, i, balanced, task == powerIndex ? CoarsenedStep(s, i, curveStep, options.PowerCurveMaxThresholds) : curveStep);
                }
            }
            else if (task == JointTask && jointAsked)
                joint = JointOccurrence(Span(values[hsIndex], n), Span(values[teIndex], n), Span(values[powerIndex], n), window, annual, options);
            else if (task == DirectionTask && directions is not null)
            {
                direction.Prepare(calendar);
                direction.Accumulate(directions.AsSpan(0, n), Span(values[powerIndex], n), window.IncludedSlots);
                if (spreads is not null)
                {
                    directionality.Prepare(calendar);
                    directionality.Accumulate(directions.AsSpan(0, n), spreads.AsSpan(0, n), Span(values[powerIndex], n), window.IncludedSlots);
                }
            }
        }
        try
        {
            // A long series (decades of hourly steps) spreads the sorts, the joint table and the direction sums over
            // every core, one task at a time so that a free core takes the next; a short one is not worth the hand-off.
            if (parallel) Parallel.ForEach(Partitioner.Create(TaskOrder, EnumerablePartitionerOptions.NoBuffering), Run);
            else foreach (int task in TaskOrder) Run(task);

            var periods = new PeriodStatistics[window.Periods.Count];
            for (int i = 0; i < periods.Length; i++)
            {
                (AtlasPeriod period, int[] slots, long expected, long[] expectedByMonth) = window.Periods[i];
                SummaryStatistics hsSummary = summaries[hsIndex][i], powerSummary = summaries[powerIndex][i];
                bool balanced = MonthBalance.Applies(period);
                PeriodDirectionality d = directionality.Summarise(slots, expected, expectedByMonth, balanced);
                periods[i] = new PeriodStatistics(
                    period, expected, hsSummary, summaries[teIndex][i], summaries[2][i], powerSummary, summaries[4][i], d.AsSummary(),
                    direction.Summarise(slots, expected, expectedByMonth, balanced) with
                    {
                        DirectionalityCoefficient = d.Coefficient,
                        MaxPowerFromDeg = d.MaxPowerFromDegrees,
                    },
                    exceedances[hsIndex][i] ?? NoExceedance(settings.HsThresholdsMetres),
                    exceedances[powerIndex][i] ?? NoExceedance(settings.PowerThresholdsKilowattsPerMetre),
                    (hasPower ? powerSummary.Coverage : hsSummary.Coverage) < settings.LowCoverageThreshold);
            }

            return new ExactPointStatistics(
                series.DepthMetres,
                derived.DeepWaterAssumed,
                derived.EnergyPeriodSource,
                definition,
                options.Window,
                window.StepsInWindow,
                periods,
                curves[hsIndex] ?? Curve(WaveParameter.Hs, null, annual, null, options.HsCurveStepMetres),
                curves[powerIndex] ?? Curve(WaveParameter.J, null, annual, null, options.PowerCurveStepKilowattsPerMetre),
                joint ?? new JointOccurrenceTable(options.JointHsBinMetres, options.JointTeBinSeconds, [], [], [], [], [], [], 0),
                interAnnualAsked ? InterAnnual(sums[hsIndex]!, sums[teIndex]!, sums[powerIndex]!, hasPower, window, settings.LowCoverageThreshold) : []);
        }
        finally
        {
            foreach (SortedPeriodValues? s in sorted) s?.Dispose();
        }
    }

    private static ReadOnlySpan<float> Span(float[]? values, int length) => values is null ? [] : values.AsSpan(0, length);

    private static ExceedanceFraction[] NoExceedance(IReadOnlyList<double> thresholds) =>
        [.. thresholds.Select(t => new ExceedanceFraction(t, double.NaN))];

    private static ExceedanceFraction[] Exceedances(SortedPeriodValues? values, int period, BalancedValues? balanced, IReadOnlyList<double> thresholds)
    {
        ReadOnlySpan<double> sorted = values is null ? [] : values.Of(period);
        var result = new ExceedanceFraction[thresholds.Count];
        for (int t = 0; t < result.Length; t++)
        {
            double fraction = sorted.Length == 0 ? double.NaN
                : balanced?.FractionAbove(thresholds[t]) ?? (double)ExactSummary.CountAbove(sorted, thresholds[t]) / sorted.Length;
            result[t] = new ExceedanceFraction(thresholds[t], fraction);
        }
        return result;
    }

    /// <summary>
    /// The threshold step of a curve over the sorted values: <paramref name="step"/>, or when that needs more than
    /// <paramref name="maxThresholds"/> thresholds up to the largest value, the smallest 1, 2 or 5 times a power of ten
    /// times it that needs no more.
    /// </summary>
    internal static double CoarsenedStep(SortedPeriodValues? values, int annual, double step, int? maxThresholds)
    {
        ReadOnlySpan<double> sorted = values is null || annual < 0 ? [] : values.Of(annual);
        if (maxThresholds is not { } most || sorted.Length == 0) return step;
        double largest = sorted[^1];
        for (double decade = 1; ; decade *= 10)
            foreach (int factor in (ReadOnlySpan<int>)[1, 2, 5])
            {
                double candidate = Math.Round(step * factor * decade, 9);
                if (Math.Ceiling(largest / candidate) + 1 <= most) return candidate;
            }
    }

    private static ExceedanceCurve Curve(WaveParameter parameter, SortedPeriodValues? values, int annual, BalancedValues? balanced, double step)
    {
        ReadOnlySpan<double> sorted = values is null || annual < 0 ? [] : values.Of(annual);
        if (sorted.Length == 0) return new ExceedanceCurve(parameter, step, [], [], 0);
        int points = (int)Math.Ceiling(sorted[^1] / step) + 1;
        var thresholds = new double[points];
        var fractions = new double[points];
        for (int k = 0; k < points; k++)
        {
            // Rounded so that the thresholds read 0.3 rather than 0.30000000000000004; compared in single precision anyway.
            thresholds[k] = Math.Round(k * step, 9);
            fractions[k] = balanced?.FractionAbove(thresholds[k]) ?? (double)ExactSummary.CountAbove(sorted, thresholds[k]) / sorted.Length;
        }
        return new ExceedanceCurve(parameter, step, thresholds, fractions, sorted.Length);
    }

    private static JointOccurrenceTable JointOccurrence(ReadOnlySpan<float> hs, ReadOnlySpan<float> te, ReadOnlySpan<float> power,
        WindowedPeriods window, int annual, ExactPointOptions options)
    {
        double hsBin = options.JointHsBinMetres, teBin = options.JointTeBinSeconds;
        int rows = 0, firstColumn = int.MaxValue, lastColumn = -1;
        int total = 0;
        ReadOnlySpan<int> stepSlots = window.Calendar.StepSlots;
        Span<long> validByMonth = stackalloc long[12];
        // One pass finds each counted step's bin and the table's extent; the second fills the table from those
        // bins, in step order as before, without dividing again.
        int[] rowOf = ArrayPool<int>.Shared.Rent(power.Length), columnOf = ArrayPool<int>.Shared.Rent(power.Length);
        float[] powerOf = ArrayPool<float>.Shared.Rent(power.Length);
        byte[] monthOf = ArrayPool<byte>.Shared.Rent(power.Length);
        try
        {
            for (int i = 0; i < power.Length; i++)
            {
                if (!window.Includes(stepSlots[i]) || !ParameterValidity.IsValid(WaveParameter.J, power[i])) continue;
                int row = (int)(hs[i] / hsBin), column = (int)(te[i] / teBin);
                rows = Math.Max(rows, row + 1);
                firstColumn = Math.Min(firstColumn, column);
                lastColumn = Math.Max(lastColumn, column);
                rowOf[total] = row;
                columnOf[total] = column;
                int month = stepSlots[i] % 12;
                monthOf[total] = (byte)month;
                validByMonth[month]++;
                powerOf[total++] = power[i];
            }
            if (total == 0) return new JointOccurrenceTable(hsBin, teBin, [], [], [], [], [], [], 0);

            // The table covers the window's whole span, month-balanced like its annual statistics: each step weighs
            // its month's weight (1 for all when the months are balanced already).
            Span<double> weights = stackalloc double[12];
            if (annual < 0 || !MonthBalance.TryWeights(window.Periods[annual].ExpectedByMonth, validByMonth, weights)) weights.Fill(1);
            int columns = lastColumn - firstColumn + 1;
            var counts = new long[rows][];
            var weight = new double[rows][];
            var energy = new double[rows][];
            for (int r = 0; r < rows; r++) { counts[r] = new long[columns]; weight[r] = new double[columns]; energy[r] = new double[columns]; }
            double totalWeight = 0, totalEnergy = 0;
            for (int k = 0; k < total; k++)
            {
                int r = rowOf[k], c = columnOf[k] - firstColumn;
                double w = weights[monthOf[k]];
                counts[r][c]++;
                weight[r][c] += w;
                energy[r][c] += w * powerOf[k];
                totalWeight += w;
                totalEnergy += w * powerOf[k];
            }
            return Fractions(hsBin, teBin, firstColumn, counts, weight, energy, totalWeight, totalEnergy, total);
        }
        finally
        {
            ArrayPool<int>.Shared.Return(rowOf);
            ArrayPool<int>.Shared.Return(columnOf);
            ArrayPool<float>.Shared.Return(powerOf);
            ArrayPool<byte>.Shared.Return(monthOf);
        }
    }

    private static JointOccurrenceTable Fractions(double hsBin, double teBin, int firstColumn, long[][] counts, double[][] weight, double[][] energy,
        double totalWeight, double totalEnergy, long total)
    {
        int rows = counts.Length, columns = counts[0].Length;
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
                fractionOfTime[r][c] = weight[r][c] / totalWeight;
                meanPower[r][c] = counts[r][c] > 0 ? energy[r][c] / weight[r][c] : null;
                fractionOfEnergy[r][c] = totalEnergy > 0 ? energy[r][c] / totalEnergy : 0;
            }
        }
        return new JointOccurrenceTable(hsBin, teBin,
            [.. Enumerable.Range(0, rows).Select(r => r * hsBin)],
            [.. Enumerable.Range(firstColumn, columns).Select(c => c * teBin)],
            counts, fractionOfTime, meanPower, fractionOfEnergy, total);
    }

    private static InterAnnualSeries[] InterAnnual(SlotSums hsSums, SlotSums teSums, SlotSums powerSums, bool hasPower,
        WindowedPeriods window, double lowCoverageThreshold)
    {
        TimelineCalendar calendar = window.Calendar;
        IReadOnlyList<int>? windowMonths = window.Window?.Months is { Count: > 0 } m ? m : null;
        var result = new List<InterAnnualSeries>();
        var slots = new List<int>();
        foreach (AtlasPeriod period in InterAnnualPeriods)
        {
            var years = new List<YearlyMeans>();
            // A season of one year is contiguous: the winter of year Y is December of Y - 1 with January and February
            // of Y, so a record's last December opens one more winter.
            int lastYear = calendar.FirstYear + calendar.YearSpan - 1 + (period == AtlasPeriod.Djf ? 1 : 0);
            for (int year = calendar.FirstYear; year <= lastYear && calendar.YearSpan > 0; year++)
            {
                slots.Clear();
                long expected = 0;
                bool hasSteps = false;
                foreach ((int y, int month) in SeasonYearMonths(period, year))
                {
                    // Months the window leaves out entirely are neither data nor expected; months outside the record
                    // or the window's years are expected and missing (the season is cut, and flagged).
                    if (windowMonths is not null && !windowMonths.Contains(month)) continue;
                    expected += calendar.ExpectedInMonth(y, month);
                    if (y < calendar.FirstYear || y >= calendar.FirstYear + calendar.YearSpan) continue;
                    int slot = calendar.SlotOf(y, month);
                    if (!window.Includes(slot)) continue;
                    slots.Add(slot);
                    hasSteps |= calendar.StepsInSlot(slot) > 0;
                }
                if (!hasSteps || expected == 0) continue;
                (double hsMean, long hsCount) = hsSums.Mean(slots);
                (double teMean, _) = teSums.Mean(slots);
                (double powerMean, long powerCount) = powerSums.Mean(slots);
                double coverage = (double)(hasPower ? powerCount : hsCount) / expected;
                years.Add(new YearlyMeans(year, SeasonYearLabel(period, year), hsMean, teMean, powerMean, coverage, coverage < lowCoverageThreshold));
            }
            if (years.Count == 0) continue;
            YearlyMeans[] used = [.. years.Where(y => !y.LowCoverage)];
            result.Add(new InterAnnualSeries(period, years, used.Length, [.. years.Where(y => y.LowCoverage).Select(y => y.Year)],
                CoefficientOfVariation(used.Select(y => y.Hs)),
                CoefficientOfVariation(used.Select(y => y.Te)),
                CoefficientOfVariation(used.Select(y => y.J))));
        }
        return [.. result];
    }

    /// <summary>The (year, month) of each month of a period in one year: DJF of Y is December of Y - 1, January and February of Y.</summary>
    private static IEnumerable<(int Year, int Month)> SeasonYearMonths(AtlasPeriod period, int year) =>
        period.Months.Select(month => (period == AtlasPeriod.Djf && month == 12 ? year - 1 : year, month));

    /// <summary>
    /// The label of a year's period: the year for annual; for a season the ISO 8601 interval of its first and last
    /// months, e.g. 2010-12/2011-02 for the winter of 2011.
    /// </summary>
    internal static string SeasonYearLabel(AtlasPeriod period, int year)
    {
        if (period.Kind == PeriodKind.Annual) return year.ToString("D4", System.Globalization.CultureInfo.InvariantCulture);
        (int firstYear, int firstMonth) = SeasonYearMonths(period, year).First();
        (int lastYear, int lastMonth) = SeasonYearMonths(period, year).Last();
        return FormattableString.Invariant($"{firstYear:D4}-{firstMonth:D2}/{lastYear:D4}-{lastMonth:D2}");
    }

    private static double CoefficientOfVariation(IEnumerable<double> values)
    {
        var moments = new RunningMoments();
        foreach (double v in values)
            if (!double.IsNaN(v)) moments.Add(v);
        return moments.SampleStandardDeviation / moments.Mean;
    }
}
