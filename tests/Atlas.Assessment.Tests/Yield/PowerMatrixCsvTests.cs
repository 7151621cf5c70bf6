using Atlas.Assessment.Yield;

namespace Atlas.Assessment.Tests.Yield;

// Expected values read by hand off the invented files in tests/data/assessment (header = line 2 after
// the comment line); the format is the one documented on PowerMatrixCsv.
public class PowerMatrixCsvTests
{
    private static PowerMatrix ParseFile(string fileName, double? rated = null)
    {
        using var reader = TestData.Open(fileName);
        return PowerMatrixCsv.Parse(reader, fileName, rated);
    }

    private static CsvInputException Fails(string fileName)
    {
        using var reader = TestData.Open(fileName);
        return Assert.Throws<CsvInputException>(() => PowerMatrixCsv.Parse(reader, fileName));
    }

    private static CsvInputException FailsText(string text) =>
        Assert.Throws<CsvInputException>(() => PowerMatrixCsv.Parse(new StringReader(text), "inline.csv"));

    [Fact]
    public void GoodMatrixIsReadWithItsAxesAndRatedPowerFromTheLargestCell()
    {
        var matrix = ParseFile("power_matrix_te.csv");

        Assert.Equal(WavePeriodKind.EnergyPeriod, matrix.PeriodKind);
        Assert.Equal([1.0, 2.0, 3.0], matrix.HsCentresMetres);
        Assert.Equal([6.0, 8.0, 10.0, 12.0], matrix.PeriodCentresSeconds);
        Assert.Equal(120.0, matrix.PowerAtBinKw(1, 2));
        Assert.Equal(270.0, matrix.RatedPowerKw);
        Assert.Equal((0.5, 3.5, 5.0, 13.0), (matrix.HsLowerEdgeMetres, matrix.HsUpperEdgeMetres, matrix.PeriodLowerEdgeSeconds, matrix.PeriodUpperEdgeSeconds));
    }

    [Fact]
    public void RatedPowerMayBeGivenButNotBelowTheLargestCell()
    {
        Assert.Equal(300.0, ParseFile("power_matrix_te.csv", 300).RatedPowerKw);
        Assert.Throws<ArgumentOutOfRangeException>(() => ParseFile("power_matrix_te.csv", 200));
    }

    [Fact]
    public void NonMonotonicBinsNegativePowerAndNonNumbersAreReportedWithLineAndColumn()
    {
        var failure = Fails("power_matrix_bad.csv");

        Assert.Contains(failure.Errors, e => e.LineNumber == 2 && e.ColumnNumber == 4 && e.Message.Contains("period bin centres must strictly increase: 7 s follows 8 s"));
        Assert.Contains(failure.Errors, e => e.LineNumber == 4 && e.ColumnNumber == 3 && e.Message.Contains("power -80 kW is negative"));
        Assert.Contains(failure.Errors, e => e.LineNumber == 5 && e.ColumnNumber == 1 && e.Message.Contains("1.5 m follows 2 m (line 4)"));
        Assert.Contains(failure.Errors, e => e.LineNumber == 5 && e.ColumnNumber == 4 && e.Message.Contains("'abc' is not a finite number"));
        Assert.Equal(4, failure.Errors.Count);
        Assert.StartsWith("power_matrix_bad.csv: 4 errors", failure.Message);
    }

    [Fact]
    public void MatrixWithoutRowsIsRejectedAsEmpty()
    {
        var failure = Fails("power_matrix_empty.csv");

        Assert.Contains("0 Hs rows; at least two are needed", Assert.Single(failure.Errors).Message);
        Assert.Contains("header line is required", Assert.Single(FailsText("# nothing\n").Errors).Message);
    }

    [Fact]
    public void FirstCellMustNameTheAxes()
    {
        var failure = FailsText("hs\\t,6,8\n1,1,2\n2,3,4\n");

        var error = Assert.Single(failure.Errors);
        Assert.Equal((1, 1), (error.LineNumber, error.ColumnNumber!.Value));
        Assert.Contains(@"'hs_m\te_s' (Te columns) or 'hs_m\tp_s' (Tp columns)", error.Message);
    }

    [Fact]
    public void PeakPeriodAxisIsRecognised()
    {
        var matrix = PowerMatrixCsv.Parse(new StringReader("hs_m\\tp_s,8,10\n1,5,6\n2,7,8\n"), "tp.csv");

        Assert.Equal(WavePeriodKind.PeakPeriod, matrix.PeriodKind);
    }

    [Fact]
    public void RaggedRowsEmptyCellsAndAllZeroMatricesAreRejected()
    {
        Assert.Contains("has 3 cells but the header has 4", FailsText("hs_m\\te_s,6,8,10\n1,1,2\n2,1,2,3\n").Errors[0].Message);
        Assert.Contains("power cell is empty", FailsText("hs_m\\te_s,6,8\n1,1,\n2,1,2\n").Errors[0].Message);
        Assert.Contains("every power cell is 0 kW", FailsText("hs_m\\te_s,6,8\n1,0,0\n2,0,0\n").Errors[0].Message);
        Assert.Contains("at least two are needed", FailsText("hs_m\\te_s,6\n1,1\n2,1\n").Errors[0].Message);
    }
}
