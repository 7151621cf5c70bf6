using Microsoft.Extensions.Options;

namespace Atlas.Ingest.Statistics;

/// <summary>
/// Checks the <c>Statistics</c> section at start: the options it gives must pass
/// <see cref="Atlas.Statistics.StatisticsOptions.Validate"/>; a failure names the section and the setting.
/// </summary>
public sealed class StatisticsSettingsValidation : IValidateOptions<StatisticsSettings>
{
    public ValidateOptionsResult Validate(string? name, StatisticsSettings settings)
    {
        try
        {
            settings.ToOptions().Validate();
            return ValidateOptionsResult.Success;
        }
        catch (ArgumentException e)
        {
            return ValidateOptionsResult.Fail($"{StatisticsSettings.Section}:{e.ParamName}: {e.Message.Split(" (Parameter")[0]}");
        }
    }
}
