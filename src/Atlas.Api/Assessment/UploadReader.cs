using Microsoft.AspNetCore.Http.Features;

namespace Atlas.Api.Assessment;

/// <summary>An uploaded file with its description fields, from a multipart form or from a plain body and the query string.</summary>
public sealed record Upload(byte[] Content, string FileName, IReadOnlyDictionary<string, string> Fields)
{
    public string? Field(string name) => Fields.TryGetValue(name, out var value) && value.Length > 0 ? value : null;

    /// <summary>A numeric field in [min, max]; null (with an error when required or unparsable) otherwise.</summary>
    public double? Number(string name, double min, double max, string meaning, QueryErrors errors, bool required) =>
        QueryNumbers.Read(name, Field(name), meaning, errors, required, min, max);

    /// <summary>The name field (required, with a letter or digit for its slug), or null with the fault.</summary>
    /// <param name="owner">Whose name it is, as it reads after "the" (e.g. "station's").</param>
    public string? Name(string owner, QueryErrors errors)
    {
        var name = Field("name")?.Trim();
        if (name is null) errors.Add("name", $"name is required: the {owner} name, your own.");
        else if (ReferenceSlug.From(name) is null) errors.Add("name", $"name '{name}' needs at least one letter or digit.");
        return name;
    }

    /// <summary>The answer to a file with faults: each fault under <c>file</c>, and a title that says nothing was stored.</summary>
    /// <param name="what">What the file is (e.g. "station record").</param>
    /// <param name="kind">What a fault is called (error, problem).</param>
    public ValidationProblem Refused(string what, IReadOnlyCollection<string> faults, string kind) =>
        TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["file"] = [.. faults] },
            title: $"The {what} {FileName} has {faults.Count} {kind}{(faults.Count == 1 ? "" : "s")}; nothing was stored");

    /// <summary>201 with the new reference's location, or 200 when the same file under the same name was stored already.</summary>
    public static IResult Registered<T>(bool alreadyRegistered, string location, T result) =>
        alreadyRegistered ? TypedResults.Ok(result) : TypedResults.Created(location, result);
}

/// <summary>
/// Reads a reference-file upload (a station record, a power matrix): <c>multipart/form-data</c> with the file in the
/// part named <c>file</c> and the description in form fields, or the file as the whole body (e.g. <c>text/csv</c>) with
/// the description in the query string (<c>file_name</c> names it). Query values are read in both cases; form fields win.
/// </summary>
public static class UploadReader
{
    /// <summary>The largest upload accepted, bytes: a decade of 10-minute buoy records as CSV is about 30 MB.</summary>
    public const long MaximumBytes = 64L << 20;

    /// <summary>
    /// Declares an upload endpoint: the file in the form part <c>file</c> or as the body of <paramref name="contentTypes"/>,
    /// answered with 201 (new) or 200 (the same file again), 400 for faults, 409 for a conflict and 413 beyond the limit;
    /// writing needs the API key.
    /// </summary>
    public static RouteHandlerBuilder AcceptsUpload<TRegistered>(this RouteHandlerBuilder endpoint, params string[] contentTypes) =>
        endpoint.Accepts<IFormFile>("multipart/form-data", contentTypes)
            .Produces<TRegistered>(StatusCodes.Status200OK)
            .Produces<TRegistered>(StatusCodes.Status201Created)
            .ProducesValidationProblem()
            .ProducesProblems(StatusCodes.Status409Conflict, StatusCodes.Status413PayloadTooLarge)
            .RequireApiKey();

    /// <summary>The upload, or the problem (400 without a file, 413 beyond the limit).</summary>
    public static async Task<(Upload? Upload, IResult? Problem)> ReadAsync(HttpRequest request, string defaultFileName, CancellationToken cancel)
    {
        // Reference files are larger than the API's general body limit; only these endpoints raise it, before reading.
        if (request.HttpContext.Features.Get<IHttpMaxRequestBodySizeFeature>() is { IsReadOnly: false } size) size.MaxRequestBodySize = MaximumBytes;
        var fields = request.Query.ToDictionary(q => q.Key, q => q.Value.ToString(), StringComparer.Ordinal);
        if (request.HasFormContentType)
        {
            var form = await request.ReadFormAsync(new FormOptions { MultipartBodyLengthLimit = MaximumBytes }, cancel);
            foreach (var (key, value) in form) fields[key] = value.ToString();
            var file = form.Files.GetFile("file");
            if (file is null)
                return (null, TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["file"] = ["The form has no part named 'file' holding the file."] }));
            if (file.Length > MaximumBytes) return (null, TooLarge());
            using var buffer = new MemoryStream();
            await file.CopyToAsync(buffer, cancel);
            return (new Upload(buffer.ToArray(), SafeName(file.FileName, defaultFileName), fields), null);
        }
        var body = await RequestBody.ReadAsync(request, MaximumBytes, cancel);
        if (body is null) return (null, TooLarge());
        if (body.Length == 0)
            return (null, TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["file"] = ["The request body is empty: send the file as the body, or as the form part 'file'."] }));
        return (new Upload(body, SafeName(fields.GetValueOrDefault("file_name"), defaultFileName), fields), null);
    }

    private static IResult TooLarge() => ApiProblems.TooLarge($"The file is larger than {MaximumBytes >> 20} MiB; split the record or load it with the command line.");

    /// <summary>The name without any folder part; the default when none is given.</summary>
    private static string SafeName(string? name, string fallback)
    {
        var trimmed = Path.GetFileName((name ?? "").Replace('\\', '/').Trim());
        return trimmed.Length == 0 ? fallback : trimmed;
    }
}
