using Atlas.Assessment.Validation;

namespace Atlas.Assessment.Tests.Validation;

// Expected values below are read off the invented files in tests/data/assessment by hand
// (line numbers counted in the file, header = line 1); the format is the one documented on StationRecordCsv.
public class StationRecordCsvTests
{
    private static StationRecord ParseFile(string fileName, RowOrder order = RowOrder.StrictlyIncreasing)
    {
        using var reader = TestData.Open(fileName);
        return StationRecordCsv.Parse(reader, fileName, order);
    }

    private static CsvInputException ParseFails(string fileName)
    {
        using var reader = TestData.Open(fileName);
        return Assert.Throws<CsvInputException>(() => StationRecordCsv.Parse(reader, fileName));
    }

    private static CsvInputException ParseTextFails(string text) =>
        Assert.Throws<CsvInputException>(() => StationRecordCsv.Parse(new StringReader(text), "inline.csv"));

    [Fact]
    public void GoodRecordIsReadWithEveryColumnInTimeOrder()
    {
        var record = ParseFile("station_good.csv");

        Assert.Equal(5, record.Observations.Count);
        Assert.True(record.HasTp && record.HasTe && record.HasDirection);
        var first = record.Observations[0];
        Assert.Equal(1609459200, first.TimeUnixSeconds); // 2021-01-01T00:00:00Z
        Assert.Equal(1.20, first.HsMetres);
        Assert.Equal(9.5, first.TpSeconds);
        Assert.Equal(8.1, first.TeSeconds);
        Assert.Equal(270.0, first.DirectionFromDegrees);
        Assert.Equal(4, first.LineNumber);
        Assert.All(record.Observations.Zip(record.Observations.Skip(1)), p => Assert.True(p.First.TimeUnixSeconds < p.Second.TimeUnixSeconds));
    }

    [Fact]
    public void EmptyPeriodAndMinutePrecisionTimeAreAccepted()
    {
        var third = ParseFile("station_good.csv").Observations[2];

        Assert.Equal(1609459200 + 2 * 3600, third.TimeUnixSeconds); // 2021-01-01T02:00Z
        Assert.True(double.IsNaN(third.TpSeconds));
        Assert.Equal(0.0, third.DirectionFromDegrees); // 360 is stored as 0
    }

    [Fact]
    public void FlaggedRowIsKeptCountedAndMayHoldFillValues()
    {
        var record = ParseFile("station_good.csv");

        Assert.Equal(1, record.FlaggedCount);
        var flagged = Assert.Single(record.Observations, o => o.IsFlagged);
        Assert.Equal(4, flagged.QualityFlag);
        Assert.Equal(-999, flagged.HsMetres);
        Assert.Equal(8, flagged.LineNumber);
    }

    [Fact]
    public void WrongHeaderIsReportedOnItsLineAndStopsParsing()
    {
        var failure = ParseFails("station_bad_header.csv");

        Assert.Equal("station_bad_header.csv", failure.SourceName);
        Assert.All(failure.Errors, e => Assert.Equal(2, e.LineNumber));
        Assert.Contains(failure.Errors, e => e.ColumnNumber == 2 && e.Message.Contains("unknown column 'hs'"));
        Assert.Contains(failure.Errors, e => e.ColumnNumber == 4 && e.Message.Contains("appears twice"));
        Assert.Contains(failure.Errors, e => e.Message.Contains("lacks the required column 'hs_m'"));
        Assert.StartsWith("station_bad_header.csv: 3 errors", failure.Message);
    }

    [Fact]
    public void EveryBadRowIsReportedWithItsLineNumberInOneException()
    {
        var failure = ParseFails("station_bad_rows.csv");
        string Messages(int line) => string.Join(" | ", failure.Errors.Where(e => e.LineNumber == line).Select(e => e.Message));

        Assert.Contains("'2021-03-01 02:00' is not an ISO 8601 UTC time", Messages(4));
        Assert.Contains("hs_m -0.40 is negative", Messages(5));
        Assert.Contains("duplicate time 2021-03-01T04:00:00Z, already on line 6", Messages(7));
        Assert.Contains("is not after the previous row's 2021-03-01T04:00:00Z (line 7)", Messages(8));
        Assert.Contains("hs_m is NaN", Messages(9));
        Assert.Contains("has 4 fields but the header has 5", Messages(10));
        Assert.Contains("tp_s 'abc' is not a number", Messages(11));
        Assert.Contains("dir_deg 400 is outside 0..360", Messages(11));
        Assert.Contains("qc 'x' is not an integer", Messages(12));
        Assert.Equal(9, failure.Errors.Count);
        Assert.Equal(failure.Errors.OrderBy(e => e.LineNumber).Select(e => e.LineNumber), failure.Errors.Select(e => e.LineNumber));
        Assert.Contains("line 5, column 2: hs_m -0.40 is negative", failure.Message);
    }

    [Fact]
    public void TimeWithoutUtcDesignatorOrWithAnotherOffsetIsRejected()
    {
        var failure = ParseTextFails("time,hs_m\n2021-01-01T00:00:00,1.0\n2021-01-01T01:00:00+02:00,1.0\n");

        Assert.Contains(failure.Errors, e => e.LineNumber == 2 && e.Message.Contains("no UTC designator"));
        Assert.Contains(failure.Errors, e => e.LineNumber == 3 && e.Message.Contains("has offset +02:00"));
    }

    [Fact]
    public void AnyOrderSortsRowsButStillRejectsDuplicates()
    {
        var record = StationRecordCsv.Parse(new StringReader(
            "hs_m,time\n2.0,2021-01-01T02:00:00Z\n1.0,2021-01-01T01:00:00Z\n"), "inline.csv", RowOrder.AnyOrder);
        Assert.Equal([1.0, 2.0], record.Observations.Select(o => o.HsMetres));

        var failure = Assert.Throws<CsvInputException>(() => StationRecordCsv.Parse(new StringReader(
            "time,hs_m\n2021-01-01T02:00:00Z,1\n2021-01-01T01:00:00Z,1\n2021-01-01T02:00:00Z,1\n"), "inline.csv", RowOrder.AnyOrder));
        var duplicate = Assert.Single(failure.Errors);
        Assert.Equal(4, duplicate.LineNumber);
        Assert.Contains("already on line 2", duplicate.Message);
    }

    [Fact]
    public void EmptyInputReportsTheMissingHeader()
    {
        var failure = ParseTextFails("# only a comment\n\n");

        Assert.Contains("header line is required", Assert.Single(failure.Errors).Message);
    }

    [Fact]
    public void ZeroPeriodIsRejectedOnAGoodRow()
    {
        var failure = ParseTextFails("time,hs_m,te_s\n2021-01-01T00:00:00Z,1.0,0\n");

        Assert.Contains("te_s 0 must be above 0 s", Assert.Single(failure.Errors).Message);
    }
}
