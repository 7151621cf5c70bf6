namespace Atlas.Api.Operations;

/// <summary>Finds the map page folder: the configured path, else <c>wwwroot</c> in the checkout (beside Atlas.sln).</summary>
public static class WebRootLocator
{
    public static string Locate(AtlasApiOptions options, string contentRoot)
    {
        if (!string.IsNullOrWhiteSpace(options.WebRootPath)) return Path.GetFullPath(options.WebRootPath, contentRoot);
        var checkout = AtlasHome.FindCheckout(Directory.GetCurrentDirectory())
                       ?? AtlasHome.FindCheckout(AppContext.BaseDirectory)
                       ?? contentRoot;
        return Path.Combine(checkout, "wwwroot");
    }
}
