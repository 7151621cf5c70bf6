using System.Net.Sockets;
using System.Net;
using Atlas.Api;
using Atlas.Api.Apis;
using Atlas.Cli.Demo;
using Atlas.Demo;
using Atlas.Ingest.Assessment;
using Atlas.Ingest.Ingestion;
using Atlas.Ingest.Statistics;
using Atlas.Storage;
using Atlas.TestSupport;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Routing;
using Microsoft.Playwright;

namespace Atlas.Browser.Tests;

/// <summary>
/// The whole atlas as a user meets it: a fresh database holding a reduced demo (generated, ingested and summarised
/// by the project's own code), the API serving wwwroot on a free loopback port, and Debian's headless Chromium
/// driven by Playwright. Shared by every browser test (one collection), torn down at the end.
/// </summary>
public sealed class AtlasSite : IAsyncLifetime
{
    public const string Slug = "browser-demo";

    /// <summary>The demo's output points, loaded beside <see cref="Slug"/>.</summary>
    public const string PointsSlug = "browser-demo-points";

    /// <summary>Chromium switches for a machine with no GPU, no display server and no network beyond loopback.</summary>
    public static readonly string[] ChromiumArgs =
        ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--disable-sync", "--no-first-run"];

    private readonly TestDatabase _database = new();
    private WebApplication? _app;
    private string? _demoFolder;

    public string BaseUrl { get; private set; } = "";
    public HttpClient Http { get; private set; } = null!;
    public IPlaywright Playwright { get; private set; } = null!;
    public IBrowser Browser { get; private set; } = null!;
    public string Checkout { get; } = AtlasHome.FindCheckout(AppContext.BaseDirectory)
                                      ?? throw new InvalidOperationException("Atlas.sln not found above the test binaries.");
    public string ScreenshotFolder => Path.Combine(Checkout, "tests", "artifacts", "screenshots");
    public string ArtifactFolder => Path.Combine(Checkout, "tests", "artifacts");

    public async Task InitializeAsync()
    {
        var webRoot = Path.Combine(Checkout, "wwwroot");
        if (!File.Exists(Path.Combine(webRoot, "node_modules", "leaflet", "dist", "leaflet.js")))
            throw new InvalidOperationException($"{webRoot}/node_modules is missing: run 'npm ci' in wwwroot (deploy/prepare.sh does).");

        await _database.InitializeAsync();
        _demoFolder = Directory.CreateTempSubdirectory("atlas-browser-").FullName;
        // Three months across a new year (two calendar years, so the inter-annual table has two rows), 6-hourly,
        // on a 36 x 28 grid: the same invented coast as the full demo, sampled coarsely, loaded in seconds.
        var options = new DemoScenarioOptions { Start = new DateTime(2021, 11, 1, 0, 0, 0, DateTimeKind.Utc), Months = 3, StepHours = 6, Columns = 36, Rows = 28 };
        var output = DemoScenarioWriter.Write(_demoFolder, options);
        var files = output.Scenario.FieldFiles.Select(f => Path.Combine(_demoFolder, f)).ToArray();
        await new HindcastIngestor(_database.DataSource).RunAsync(new IngestRequest(Slug, files, "Browser test coast (invented)"));
        await new StatisticsService(_database.DataSource).RunAsync(Slug, all: true);
        // The demo's spectra at its output points, loaded beside the gridded dataset as 'atlas demo' does.
        var points = output.Scenario.PointFiles.Select(f => Path.Combine(_demoFolder, f)).ToArray();
        await new HindcastIngestor(_database.DataSource).RunAsync(new IngestRequest(PointsSlug, points, "Browser test output points (invented)") { GridDataset = Slug });
        await new StatisticsService(_database.DataSource).RunAsync(PointsSlug, all: true);
        // The demo's invented buoys and device, registered as 'atlas demo' does, so the point panel has validation and yield.
        var (stations, device) = DemoReferenceFiles.Read(_demoFolder, DemoScenario.ManifestFileName);
        foreach (var s in stations)
            await new StationLoader(_database.DataSource).LoadAsync(
                new StationLoadRequest(s.Name, s.Latitude, s.Longitude, s.DepthMetres, s.Instrument, s.Role, s.FilePath));
        await new DeviceLoader(_database.DataSource).LoadAsync(device.Name, device.FilePath, device.RatedPowerKw);

        BaseUrl = $"http://127.0.0.1:{FreeLoopbackPort()}";
        _app = ApiHost.Build([
            "--urls", BaseUrl,
            $"--ConnectionStrings:{Atlas.Api.Data.AtlasConnection.ConfigurationName}={_database.ConnectionString}",
            $"--AtlasApiOptions:WebRootPath={webRoot}",
            "--Logging:LogLevel:Default=Warning",
        ]);
        // The land-mask endpoint lives in its own file; map it here when the host does not (yet) do so itself.
        if (!HasRoute(_app, LandMaskApi.RouteName)) _app.MapLandMaskApi();
        await _app.StartAsync();
        Http = new HttpClient { BaseAddress = new Uri(BaseUrl) };

        // Every wait on the page (actions, selectors, auto-waiting assertions) may last as long as CI's limit: a busy
        // machine makes the page slow, not wrong.
        Assertions.SetDefaultExpectTimeout(Patience.LimitMilliseconds);
        Playwright = await Microsoft.Playwright.Playwright.CreateAsync();
        Browser = await Playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = "/usr/bin/chromium",
            Headless = true,
            Args = ChromiumArgs,
        });
        Directory.CreateDirectory(ScreenshotFolder);
    }

    public async Task DisposeAsync()
    {
        if (Browser is not null) await Browser.DisposeAsync();
        Playwright?.Dispose();
        Http?.Dispose();
        if (_app is not null)
        {
            await _app.StopAsync();
            await _app.DisposeAsync();
        }
        await _database.DisposeAsync();
        if (_demoFolder is not null) Directory.Delete(_demoFolder, recursive: true);
    }

    /// <summary>A new page in its own context (empty cache), recording console errors and uncaught exceptions.</summary>
    public async Task<SitePage> OpenAsync(int width = 1280, int height = 800, string path = "/")
    {
        var context = await Browser.NewContextAsync(new BrowserNewContextOptions
        {
            ViewportSize = new ViewportSize { Width = width, Height = height },
            BaseURL = BaseUrl,
            AcceptDownloads = true,
        });
        context.SetDefaultTimeout(Patience.LimitMilliseconds);
        var page = await context.NewPageAsync();
        var site = new SitePage(context, page);
        page.Console += (_, message) => { if (message.Type == "error") site.Errors.Add($"console: {message.Text}"); };
        page.PageError += (_, error) => site.Errors.Add($"page error: {error}");
        page.RequestFailed += (_, request) => site.Errors.Add($"request failed: {request.Url} {request.Failure}");
        await page.GotoAsync(path);
        try
        {
            // Ready, or failed: an uncaught error or the page's own start-up failure stops the wait at once.
            await page.WaitForFunctionAsync("() => document.body.dataset.ready === 'true' || document.querySelector('#map-status.error')");
        }
        catch (TimeoutException)
        {
            throw new InvalidOperationException($"The page did not get ready: {string.Join("; ", site.Errors)}");
        }
        if (await page.GetAttributeAsync("body", "data-ready") != "true")
            throw new InvalidOperationException($"The page failed to start: {await page.TextContentAsync("#map-status")} {string.Join("; ", site.Errors)}");
        return site;
    }

    private static bool HasRoute(WebApplication app, string name) =>
        ((IEndpointRouteBuilder)app).DataSources.SelectMany(d => d.Endpoints)
            .Any(e => e.Metadata.GetMetadata<IEndpointNameMetadata>()?.EndpointName == name);

    private static int FreeLoopbackPort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}

/// <summary>One open page and what went wrong on it.</summary>
public sealed class SitePage(IBrowserContext context, IPage page) : IAsyncDisposable
{
    public IBrowserContext Context { get; } = context;
    public IPage Page { get; } = page;
    public List<string> Errors { get; } = [];

    public async ValueTask DisposeAsync() => await Context.CloseAsync();
}

[CollectionDefinition(Name)]
public sealed class AtlasSiteCollection : ICollectionFixture<AtlasSite>
{
    public const string Name = "atlas site";
}
