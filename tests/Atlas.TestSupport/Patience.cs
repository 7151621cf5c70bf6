namespace Atlas.TestSupport;

/// <summary>
/// How long a test may wait for something. CI runs the whole suite on two busy cores and stops it after 90 minutes;
/// a test that gave up sooner would fail because the machine was busy, not because the code was wrong. So every wait
/// in the tests waits for a condition (never for a fixed time) and gives up only at this limit, with a message
/// naming what it waited for.
/// </summary>
public static class Patience
{
    /// <summary>CI's limit for the whole suite; no single wait is shorter.</summary>
    public static readonly TimeSpan Limit = TimeSpan.FromMinutes(90);

    /// <summary>Milliseconds of <see cref="Limit"/>, for APIs that take an int or a float.</summary>
    public static int LimitMilliseconds => (int)Limit.TotalMilliseconds;

    /// <summary>Asks <paramref name="condition"/> again every 25 ms until it holds; fails at <see cref="Limit"/>.</summary>
    public static async Task UntilAsync(Func<Task<bool>> condition, string what)
    {
        var deadline = DateTime.UtcNow + Limit;
        while (!await condition())
        {
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"Waited {Limit.TotalMinutes} min for {what}.");
            await Task.Delay(25);
        }
    }

    /// <summary>Fetches a value until <paramref name="done"/> accepts it, and returns it; fails at <see cref="Limit"/>.</summary>
    public static async Task<T> UntilAsync<T>(Func<Task<T>> fetch, Func<T, bool> done, string what)
    {
        T value = default!;
        await UntilAsync(async () => done(value = await fetch()), what);
        return value;
    }
}
