namespace Atlas.Assessment.Yield;

/// <summary>Reads a device power matrix from comma-separated text.</summary>
/// <remarks>
/// <para>Format:</para>
/// <list type="bullet">
/// <item>Blank lines and lines starting with <c>#</c> are comments.</item>
/// <item>The first other line is the header. Its first cell names the axes, Hs in metres down the rows
/// and the period in seconds across the columns: <c>hs_m\te_s</c> for the energy period Te or
/// <c>hs_m\tp_s</c> for the peak period Tp (a literal backslash). The other cells are the period
/// <b>bin centres</b> in seconds: finite, above 0, strictly increasing, at least two.</item>
/// <item>Each following line is one Hs bin: its first cell the Hs <b>bin centre</b> in metres (finite,
/// at or above 0, strictly increasing down the file, at least two rows), then one power per period
/// column in kW (finite, at or above 0; an empty cell is an error — write 0 where the device produces
/// nothing). Every line has as many cells as the header.</item>
/// <item>The matrix may not be 0 everywhere. Bin edges lie halfway between centres (see <see cref="PowerMatrix"/>).</item>
/// </list>
/// <para>Every problem is collected and thrown together as one <see cref="CsvInputException"/>, each naming
/// its line and column.</para>
/// </remarks>
public static class PowerMatrixCsv
{
    /// <summary>Header first cell for a matrix over Hs and Te.</summary>
    public const string EnergyPeriodAxes = @"hs_m\te_s";

    /// <summary>Header first cell for a matrix over Hs and Tp.</summary>
    public const string PeakPeriodAxes = @"hs_m\tp_s";

    /// <summary>Parses a power matrix.</summary>
    /// <param name="reader">The text, read to its end.</param>
    /// <param name="name">Name for messages and for the matrix (typically the file name).</param>
    /// <param name="ratedPowerKw">Rated power in kW; null to take the largest matrix value.</param>
    /// <exception cref="CsvInputException">The text is not a valid matrix; lists every problem with line and column.</exception>
    /// <exception cref="ArgumentOutOfRangeException">The rated power given is below the largest matrix value.</exception>
    public static PowerMatrix Parse(TextReader reader, string name, double? ratedPowerKw = null)
    {
        ArgumentNullException.ThrowIfNull(reader);
        var lines = new CsvLineReader(reader);
        var errors = new List<CsvInputError>();
        if (!lines.TryReadRecord(out int headerLine, out string[] header))
            throw new CsvInputException(name, [new CsvInputError(headerLine, null, "the input is empty: a header line is required")]);

        WavePeriodKind kind = WavePeriodKind.EnergyPeriod;
        if (header[0] == PeakPeriodAxes)
            kind = WavePeriodKind.PeakPeriod;
        else if (header[0] != EnergyPeriodAxes)
            errors.Add(new CsvInputError(headerLine, 1,
                $"first header cell '{header[0]}' must name the axes: '{EnergyPeriodAxes}' (Te columns) or '{PeakPeriodAxes}' (Tp columns)"));

        var periods = new double[header.Length - 1];
        for (int c = 1; c < header.Length; c++)
        {
            periods[c - 1] = double.NaN;
            if (!CsvLineReader.TryParseNumber(header[c], out double period) || !double.IsFinite(period))
                errors.Add(new CsvInputError(headerLine, c + 1, $"period bin centre '{header[c]}' is not a finite number"));
            else if (period <= 0)
                errors.Add(new CsvInputError(headerLine, c + 1, $"period bin centre {header[c]} s must be above 0"));
            else
            {
                if (c > 1 && !double.IsNaN(periods[c - 2]) && period <= periods[c - 2])
                    errors.Add(new CsvInputError(headerLine, c + 1,
                        $"period bin centres must strictly increase: {header[c]} s follows {header[c - 1]} s"));
                periods[c - 1] = period;
            }
        }
        if (periods.Length < 2)
            errors.Add(new CsvInputError(headerLine, null, $"the header has {periods.Length} period bins; at least two are needed"));

        var hs = new List<double>();
        var rows = new List<double[]>();
        double previousHs = double.NaN;
        int previousHsLine = 0, dataLines = 0;
        while (lines.TryReadRecord(out int lineNumber, out string[] cells))
        {
            dataLines++;
            if (cells.Length != header.Length)
            {
                errors.Add(new CsvInputError(lineNumber, null, $"has {cells.Length} cells but the header has {header.Length}"));
                continue;
            }
            double hsCentre = double.NaN;
            if (!CsvLineReader.TryParseNumber(cells[0], out double parsedHs) || !double.IsFinite(parsedHs))
                errors.Add(new CsvInputError(lineNumber, 1, $"Hs bin centre '{cells[0]}' is not a finite number"));
            else if (parsedHs < 0)
                errors.Add(new CsvInputError(lineNumber, 1, $"Hs bin centre {cells[0]} m is negative"));
            else
            {
                if (!double.IsNaN(previousHs) && parsedHs <= previousHs)
                    errors.Add(new CsvInputError(lineNumber, 1,
                        $"Hs bin centres must strictly increase down the file: {cells[0]} m follows {previousHs} m (line {previousHsLine})"));
                hsCentre = parsedHs;
                previousHs = parsedHs;
                previousHsLine = lineNumber;
            }

            var row = new double[header.Length - 1];
            for (int c = 1; c < cells.Length; c++)
            {
                string text = cells[c];
                if (text.Length == 0)
                    errors.Add(new CsvInputError(lineNumber, c + 1, $"power cell is empty; write 0 where the device produces nothing"));
                else if (!CsvLineReader.TryParseNumber(text, out double power) || !double.IsFinite(power))
                    errors.Add(new CsvInputError(lineNumber, c + 1, $"power '{text}' is not a finite number of kW"));
                else if (power < 0)
                    errors.Add(new CsvInputError(lineNumber, c + 1, $"power {text} kW is negative"));
                else
                    row[c - 1] = power;
            }
            hs.Add(hsCentre);
            rows.Add(row);
        }
        if (dataLines < 2)
            errors.Add(new CsvInputError(headerLine, null, $"the matrix has {dataLines} Hs rows; at least two are needed"));

        if (errors.Count == 0 && rows.All(r => r.All(p => p == 0)))
            errors.Add(new CsvInputError(headerLine, null, "every power cell is 0 kW: the device would never produce"));
        if (errors.Count > 0)
            throw new CsvInputException(name, [.. errors.OrderBy(e => e.LineNumber)]);

        var power2d = new double[rows.Count, periods.Length];
        for (int i = 0; i < rows.Count; i++)
            for (int j = 0; j < periods.Length; j++)
                power2d[i, j] = rows[i][j];
        return new PowerMatrix(name, kind, hs.ToArray(), periods, power2d, ratedPowerKw);
    }
}
