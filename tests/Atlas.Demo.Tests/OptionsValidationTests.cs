namespace Atlas.Demo.Tests;

public class OptionsValidationTests
{
    [Fact]
    public void StartOffTheFirstOfAMonthIsRejectedNamingTheOption()
    {
        var options = DemoScenarioOptions.Full with { Start = new DateTime(2021, 1, 2, 0, 0, 0, DateTimeKind.Utc) };
        var error = Assert.Throws<ArgumentOutOfRangeException>(options.Validate);
        Assert.Equal(nameof(DemoScenarioOptions.Start), error.ParamName);
    }

    [Fact]
    public void LocalStartIsRejected()
    {
        var options = DemoScenarioOptions.Full with { Start = new DateTime(2021, 1, 1, 0, 0, 0, DateTimeKind.Local) };
        Assert.Throws<ArgumentOutOfRangeException>(options.Validate);
    }

    [Theory]
    [InlineData(5)]
    [InlineData(0)]
    [InlineData(25)]
    public void StepThatDoesNotDivideADayIsRejected(int stepHours)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>((DemoScenarioOptions.Full with { StepHours = stepHours }).Validate);
        Assert.Equal(nameof(DemoScenarioOptions.StepHours), error.ParamName);
    }

    [Fact]
    public void TooSmallGridIsRejected()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>((DemoScenarioOptions.Full with { Columns = 5 }).Validate);
        Assert.Equal(nameof(DemoScenarioOptions.Columns), error.ParamName);
    }

    [Fact]
    public void BuoyIntervalThatDoesNotDivideAnHourIsRejected()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>((DemoScenarioOptions.Full with { BuoyIntervalMinutes = 7 }).Validate);
        Assert.Equal(nameof(DemoScenarioOptions.BuoyIntervalMinutes), error.ParamName);
    }

    [Fact]
    public void FullDemoDescribesThreeYearsOfMonthlyFilesOnTheNinetyBySeventyGrid()
    {
        var scenario = DemoScenario.Describe(DemoScenarioOptions.Full);
        Assert.Equal(36, scenario.FieldFiles.Count);
        Assert.Equal([2021, 2022, 2023], scenario.Years);
        Assert.Equal((90, 70), (scenario.Columns, scenario.Rows));
        Assert.Equal(3, scenario.StepHours);
        Assert.Contains(scenario.Buoys, b => b.Role == BuoyRole.Calibration);
        Assert.Contains(scenario.Buoys, b => b.Role == BuoyRole.Validation);
        Assert.Equal(380.0, scenario.Device.RatedKilowatts);
        Assert.Contains(scenario.DescribeLines(), l => l.Contains("Skelvane Reach"));
    }
}
