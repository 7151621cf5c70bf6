using Atlas.Api.Infrastructure;
using Atlas.Api.Tests.Support;
using Microsoft.Extensions.Options;

namespace Atlas.Api.Tests.Operations;

[Collection(AtlasApiCollection.Name)]
public sealed class StartupValidationTests(AtlasApiFixture atlas)
{
    [Theory]
    [InlineData("AtlasApiOptions:CorsOrigins:0", "maps.example.org/page", "CorsOrigins")]
    [InlineData("AtlasApiOptions:WebRootPath", "/no/such/folder/for/the/map", "WebRootPath")]
    [InlineData("AtlasApiOptions:ApiKeySha256:1", "plain-text-key", "SHA-256")]
    [InlineData("AtlasApiOptions:ExpensiveRequestsPerMinute", "0", "ExpensiveRequestsPerMinute")]
    public void AWrongOptionStopsTheStartWithItsName(string key, string value, string named)
    {
        using var api = atlas.Create(new Dictionary<string, string?> { [key] = value });
        var error = Assert.Throws<OptionsValidationException>(() => api.CreateClient());
        Assert.Contains(named, error.Message);
    }

    [Theory]
    [InlineData("ConnectionStrings:AtlasRead", "this is not a connection string")]
    [InlineData("ConnectionStrings:AtlasRead", "Port=5432;Database=atlas")]
    [InlineData("ConnectionStrings:Atlas", "Host=127.0.0.1;Port=notaport")]
    public void AMalformedConnectionStringStopsTheStartWithItsName(string key, string value)
    {
        using var api = atlas.Create(new Dictionary<string, string?> { [key] = value });
        var error = Assert.ThrowsAny<Exception>(() => api.CreateClient());
        Assert.Contains(key, error.Message);
        Assert.Contains("connection string", error.Message);
    }
}
