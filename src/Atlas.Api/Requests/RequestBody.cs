namespace Atlas.Api.Requests;

/// <summary>Reads a request body into memory, refusing to read past a limit (whatever Content-Length claims).</summary>
public static class RequestBody
{
    /// <summary>The body, or null when it is longer than <paramref name="limitBytes"/>.</summary>
    public static async Task<byte[]?> ReadAsync(HttpRequest request, long limitBytes, CancellationToken cancel)
    {
        using var buffer = new MemoryStream();
        var chunk = new byte[16 * 1024];
        int read;
        while ((read = await request.Body.ReadAsync(chunk, cancel)) > 0)
        {
            if (buffer.Length + read > limitBytes) return null;
            buffer.Write(chunk, 0, read);
        }
        return buffer.ToArray();
    }
}
