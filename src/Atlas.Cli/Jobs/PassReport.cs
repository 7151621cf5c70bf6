using System.Globalization;
using Atlas.Ingest.Progress;
using Atlas.Storage.Passes;

namespace Atlas.Cli.Jobs;

/// <summary>One line per statistics pass in parts, as <c>atlas jobs</c> and <c>atlas datasets show</c> print it.</summary>
public static class PassReport
{
    public static string Line(PassProgress p, DateTime nowUtc)
    {
        var pass = p.Pass;
        var line = string.Create(CultureInfo.InvariantCulture,
            $"pass {pass.Id}  {PassStore.KindName(pass.Kind)}  {pass.DatasetSlug}  {pass.State}  parts: {p.Done} done, {p.Running} running, {p.Queued} queued, {p.Failed} failed of {pass.PartCount}");
        if (p.Remaining(nowUtc) is { } left) line += $"; about {ProgressSnapshot.FormatDuration(left)} left";
        else if (pass.State == "open" && p.Done == 0) line += "; time left known once a part is done";
        if (pass.FinishedAtUtc is { } finished && p.FirstClaimUtc is { } first)
            line += $"; {pass.State} in {ProgressSnapshot.FormatDuration(finished - first)}";
        if (pass.Error is { } error) line += ": " + error;
        return line;
    }
}
