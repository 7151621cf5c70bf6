namespace Atlas.Ingest.Progress;

/// <summary>
/// Writes progress to the console at most a few times a second: rewriting one line on a terminal, plain lines
/// every few seconds when the output is redirected (logs and CI).
/// </summary>
public sealed class ConsoleProgress : IProgress<ProgressSnapshot>
{
    private readonly TextWriter _out;
    private readonly bool _interactive;
    private DateTime _last = DateTime.MinValue;
    private string _lastStage = "";

    public ConsoleProgress(TextWriter? output = null)
    {
        _out = output ?? Console.Error;
        _interactive = output is null && !Console.IsErrorRedirected;
    }

    public void Report(ProgressSnapshot value)
    {
        var now = DateTime.UtcNow;
        var interval = _interactive ? TimeSpan.FromMilliseconds(250) : TimeSpan.FromSeconds(5);
        var finished = value.Done >= value.Total;
        if (value.Stage == _lastStage && !finished && now - _last < interval) return;
        if (value.Stage != _lastStage && _interactive && _lastStage.Length > 0) _out.WriteLine();
        _last = now;
        _lastStage = value.Stage;
        if (_interactive) _out.Write("\r" + value.Describe().PadRight(100));
        else _out.WriteLine(value.Describe());
        if (finished && _interactive) { _out.WriteLine(); _lastStage = ""; }
    }
}
