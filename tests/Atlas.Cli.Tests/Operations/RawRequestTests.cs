using System.Net;
using System.Net.Sockets;
using System.Text;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Operations;

/// <summary>
/// Malformed HTTP sent byte for byte to a running <c>atlas serve</c> (Kestrel), which the in-memory test server of
/// the API tests never sees: NUL and invalid UTF-8 in the path, an oversized request line and header.
/// </summary>
public sealed class RawRequestTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    [Fact]
    public async Task MalformedRequestLinesAreClientErrorsAndTheServerCarriesOn()
    {
        var port = RunningAtlas.FreePort();
        using var server = new RunningAtlas("serve", new Dictionary<string, string>
        {
            ["ATLAS_DB"] = database.ConnectionString,
            ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}",
        });
        await Patience.UntilAsync(async () => (await SendAsync(port, "GET /healthz HTTP/1.1\r\nHost: x\r\n\r\n"u8.ToArray())).StartsWith("HTTP/1.1 200"),
            $"the server to answer\n{server.Output}");

        var cases = new (string What, byte[] Request, int[] Expected)[]
        {
            ("NUL in a download name", "GET /api/v1/datasets/x/layers/hs/mean/annual.tif%00.png HTTP/1.1\r\nHost: x\r\n\r\n"u8.ToArray(), [400]),
            ("raw NUL byte in the path", [.. "GET /api/v1/datasets/a"u8, 0, .. " HTTP/1.1\r\nHost: x\r\n\r\n"u8], [400]),
            ("invalid UTF-8 in the path", [.. "GET /api/v1/datasets/"u8, 0xC0, 0xAF, 0xFF, .. " HTTP/1.1\r\nHost: x\r\n\r\n"u8], [400, 404]),
            ("overlong UTF-8 dot-dot", "GET /%c0%ae%c0%ae/%c0%ae%c0%ae/etc/passwd HTTP/1.1\r\nHost: x\r\n\r\n"u8.ToArray(), [400, 404]),
            ("a 64 KB query string", Encoding.ASCII.GetBytes($"GET /api/v1/datasets?q={new string('%', 1)}27{new string('a', 65_536)} HTTP/1.1\r\nHost: x\r\n\r\n"), [414, 400]),
            ("a 64 KB header", Encoding.ASCII.GetBytes($"GET /healthz HTTP/1.1\r\nHost: x\r\nX-Filler: {new string('b', 65_536)}\r\n\r\n"), [431, 400]),
            ("a header with a bare CR", "GET /healthz HTTP/1.1\r\nHost: x\r\nX-Split: a\rb\r\n\r\n"u8.ToArray(), [400]),
            ("no Host header", "GET /healthz HTTP/1.1\r\n\r\n"u8.ToArray(), [400]),
        };
        foreach (var (what, request, expected) in cases)
        {
            var answer = await SendAsync(port, request);
            var status = answer.Length >= 12 && int.TryParse(answer.AsSpan(9, 3), out var s) ? s : -1;
            Assert.True(expected.Contains(status), $"{what}: {answer[..Math.Min(answer.Length, 200)]}");
            Assert.DoesNotContain("root:", answer);
        }
        Assert.StartsWith("HTTP/1.1 200", await SendAsync(port, "GET /healthz HTTP/1.1\r\nHost: x\r\n\r\n"u8.ToArray()));
        Assert.False(server.HasExited);
        Assert.Equal(0, server.Terminate());
    }

    private static async Task<string> SendAsync(int port, byte[] request)
    {
        try
        {
            using var client = new TcpClient();
            await client.ConnectAsync(IPAddress.Loopback, port);
            await using var stream = client.GetStream();
            await stream.WriteAsync(request);
            // Every case is a complete request that the server answers (or closes); Kestrel's own header timeout
            // ends a connection it is still reading, so only CI's limit applies here.
            using var timeout = new CancellationTokenSource(Patience.Limit);
            var buffer = new byte[4096];
            var read = await stream.ReadAsync(buffer, timeout.Token);
            return Encoding.Latin1.GetString(buffer, 0, read);
        }
        catch (Exception e) when (e is SocketException or IOException)
        {
            return "";
        }
    }
}
