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
            // The options' messages begin with the setting's name where they can; the section is put before it.
            var message = e.Message.Split(" (Parameter")[0];
            return ValidateOptionsResult.Fail(e.ParamName is { } setting && !message.StartsWith(setting, StringComparison.Ordinal)
                ? $"{StatisticsSettings.Section}:{setting}: {message}"
                : $"{StatisticsSettings.Section}:{message}");
        }
    }
}
