namespace Atlas.Api.Assessment;

/// <summary><c>/api/v1/devices</c>: wave-energy converters' power matrices, for production estimates.</summary>
public static class DeviceApi
{
    public static IEndpointRouteBuilder MapDeviceApi(this IEndpointRouteBuilder routes) =>
        routes.MapReferenceRegistry<DeviceRegistered>("/api/v1/devices", "Devices", "device", ListAsync, DescribeAsync, AddAsync, DeleteAsync, "text/csv");

    [EndpointName("ListDevices")]
    [EndpointSummary("The stored device power matrices")]
    public static async Task<Ok<DeviceList>> ListAsync(NpgsqlDataSource dataSource, CancellationToken cancel) =>
        TypedResults.Ok(new DeviceList([.. (await new DeviceStore(dataSource).ListAsync(cancel)).Select(DeviceItem.From)], MatrixInterpolationQuery.Note, AtlasCaution.Text));

    [EndpointName("DescribeDevice")]
    [EndpointSummary("One device, by name or slug")]
    public static async Task<Results<Ok<DeviceItem>, ProblemHttpResult>> DescribeAsync(string device, NpgsqlDataSource dataSource, CancellationToken cancel) =>
        await new DeviceStore(dataSource).FindAsync(device, cancel) is { } found ? TypedResults.Ok(DeviceItem.From(found)) : ApiProblems.UnknownDevice(device);

    [EndpointName("AddDevice")]
    [EndpointSummary("Store a device power matrix (needs X-Api-Key)")]
    [EndpointDescription(
        "multipart/form-data with the matrix in the part 'file', or the matrix as a text/csv body; name (required) and rated_kw " +
        "(optional, default the largest matrix value) as form fields or query values. The CSV's first cell names the axes, " +
        "hs_m\\te_s or hs_m\\tp_s; the rest of the first line are period bin centres (s), the first column Hs bin centres (m), the body " +
        "power in kW. Bins must strictly increase, power be finite and at or above 0 and not 0 everywhere; every problem is reported " +
        "with its line and column and nothing is stored.")]
    public static async Task<IResult> AddAsync(HttpRequest request, [FromKeyedServices(AtlasDataSources.Writer)] NpgsqlDataSource dataSource, CancellationToken cancel)
    {
        var (upload, problem) = await UploadReader.ReadAsync(request, "power-matrix.csv", cancel);
        if (upload is null) return problem!;
        var errors = new QueryErrors();
        var name = upload.Name("device's", errors);
        var rated = upload.Number("rated_kw", double.Epsilon, 1e9, "the rated power in kW, above 0", errors, required: false);
        if (errors.Count > 0) return TypedResults.ValidationProblem(errors, title: "The device description has invalid fields");

        // The one registration path (the command line's too): same format, same checks.
        try
        {
            var loaded = await new DeviceLoader(dataSource).LoadAsync(name!, upload.Content, upload.FileName, rated, cancel);
            var result = new DeviceRegistered(DeviceItem.From(loaded.Device), loaded.AlreadyRegistered, AtlasCaution.Text);
            return Upload.Registered(loaded.AlreadyRegistered, $"/api/v1/devices/{loaded.Device.Slug}", result);
        }
        catch (CsvInputException e)
        {
            return upload.Refused("power matrix", [.. e.Errors.Select(x => x.ToString())], "error");
        }
        catch (ArgumentOutOfRangeException e)
        {
            return TypedResults.ValidationProblem(new Dictionary<string, string[]> { ["rated_kw"] = [e.Message.Split(" (Parameter")[0]] });
        }
        catch (DuplicateDeviceException e)
        {
            return ApiProblems.Conflict("The device conflicts with a stored one", e.Message);
        }
    }

    [EndpointName("DeleteDevice")]
    [EndpointSummary("Remove a device (needs X-Api-Key)")]
    public static async Task<Results<NoContent, ProblemHttpResult>> DeleteAsync(string device, [FromKeyedServices(AtlasDataSources.Writer)] NpgsqlDataSource dataSource, CancellationToken cancel) =>
        await new DeviceStore(dataSource).DeleteAsync(device, cancel) ? TypedResults.NoContent() : ApiProblems.UnknownDevice(device);

}
