namespace Atlas.Storage;

/// <summary>
/// Where the tool keeps its own state: the embedded database cluster, generated demo files and caches.
/// ATLAS_HOME wins; otherwise the folder ".atlas" beside the checkout's Atlas.sln (found by walking up from the
/// working directory, then from the program's folder); otherwise ".atlas" in the working directory.
/// </summary>
public static class AtlasHome
{
    public static string Resolve()
    {
        var configured = Environment.GetEnvironmentVariable("ATLAS_HOME");
        if (!string.IsNullOrWhiteSpace(configured)) return Path.GetFullPath(configured);
        var checkout = FindCheckout(Directory.GetCurrentDirectory()) ?? FindCheckout(AppContext.BaseDirectory);
        return Path.Combine(checkout ?? Directory.GetCurrentDirectory(), ".atlas");
    }

    /// <summary>The folder holding Atlas.sln at or above <paramref name="start"/>, or null.</summary>
    public static string? FindCheckout(string start)
    {
        for (var dir = new DirectoryInfo(start); dir is not null; dir = dir.Parent)
            if (File.Exists(Path.Combine(dir.FullName, "Atlas.sln"))) return dir.FullName;
        return null;
    }
}
