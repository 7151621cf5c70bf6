using Atlas.Ingest.Ingestion;
using Atlas.TestSupport;
using Npgsql;
using Xunit.Abstractions;

namespace Atlas.Ingest.Tests.Fuzz;

/// <summary>
/// Mutated and truncated copies of fixtures written by netCDF4-python, in every format the reader takes, ingested over
/// a stored dataset with <c>Replace</c> (so a failure that left anything behind would show in its rows). Fixed seed,
/// fixed count, and a case that never finishes named as the one that hung.
/// </summary>
public sealed class NetCdfFuzzTests(TestDatabase database, ITestOutputHelper output) : IClassFixture<TestDatabase>
{
    private const int Seed = 20261202, Cases = 200, Steps = 8;
    private const string Slug = "fuzzed";

    [Fact]
    public async Task MutatedAndTruncatedFilesNeitherCrashNorHangNorChangeTheStoredDatasetWhenRefused()
    {
        var originals = new[]
        {
            FixtureFiles.Make("fuzz-nc4.nc", 0, Steps, "--format NETCDF4"),
            FixtureFiles.Make("fuzz-nc4-packed.nc", 0, Steps, "--format NETCDF4 --packed"),
            FixtureFiles.Make("fuzz-classic.nc", 0, Steps, "--format NETCDF3_CLASSIC"),
            FixtureFiles.Make("fuzz-64bit-packed.nc", 0, Steps, "--format NETCDF3_64BIT_OFFSET --packed"),
            FixtureFiles.Make("fuzz-cdf5.nc", 0, Steps, "--format NETCDF3_64BIT_DATA"),
        }.Select(path => (Name: Path.GetFileNameWithoutExtension(path), Bytes: File.ReadAllBytes(path))).ToArray();
        await new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest(Slug, [FixtureFiles.Make("fuzz-base.nc", 0, Steps)]));

        var random = new Random(Seed);
        int refused = 0, loaded = 0;
        var unnamed = new List<string>();
        for (var n = 0; n < Cases; n++)
        {
            var (name, bytes) = originals[random.Next(originals.Length)];
            var (mutated, how) = Mutate(bytes, random);
            var path = Path.Combine(FixtureFiles.Folder, $"case-{n:000}-{name}.nc");
            await File.WriteAllBytesAsync(path, mutated);
            var before = await FingerprintAsync();
            var ingest = Task.Run(() => new HindcastIngestor(database.DataSource).RunAsync(new IngestRequest(Slug, [path], ReplaceOverlap: true)));
            // A hang shows as the case that never finishes: only CI's limit may call it one, since a busy machine
            // can make any case slow.
            var finished = await Task.WhenAny(ingest, Task.Delay(Patience.Limit));
            Assert.True(finished == ingest, $"case {n} ({name}, {how}) hung for {Patience.Limit.TotalMinutes} min");
            try
            {
                await ingest;
                loaded++;
            }
            catch (Exception e)
            {
                refused++;
                Assert.True(await FingerprintAsync() == before, $"case {n} ({name}, {how}) failed with '{e.Message}' and changed the stored dataset");
                // A refusal names the file it refused, so an operator can find it among many.
                if (!e.Message.Contains(Path.GetFileName(path), StringComparison.Ordinal)) unnamed.Add($"case {n} ({how}): {e.GetType().Name}: {e.Message}");
            }
            File.Delete(path);
        }
        output.WriteLine($"{Cases} cases (seed {Seed}): {refused} refused, {loaded} loaded (mutations that left a valid file)");
        Assert.True(unnamed.Count == 0, "refusals that do not name the file:\n" + string.Join('\n', unnamed));
        Assert.True(refused >= Cases / 2, $"only {refused} of {Cases} mutated files were refused: the mutations are too gentle to test anything");
    }

    /// <summary>One of: a truncation, a run of random bytes, single bit flips, or a 4- or 8-byte field set to an extreme.</summary>
    private static (byte[] Bytes, string How) Mutate(byte[] original, Random random)
    {
        var bytes = (byte[])original.Clone();
        // Most of what a reader trusts lives in the first kilobytes (classic header, HDF5 superblock and object headers).
        int Offset() => random.Next(2) == 0 ? random.Next(Math.Min(bytes.Length, 4096)) : random.Next(bytes.Length);
        switch (random.Next(4))
        {
            case 0:
                var length = random.Next(bytes.Length);
                return (bytes[..length], $"truncated to {length} of {bytes.Length} bytes");
            case 1:
                var at = Offset();
                var run = Math.Min(random.Next(1, 64), bytes.Length - at);
                random.NextBytes(bytes.AsSpan(at, run));
                return (bytes, $"{run} random bytes at {at}");
            case 2:
                var flips = random.Next(1, 9);
                for (var f = 0; f < flips; f++) bytes[Offset()] ^= (byte)(1 << random.Next(8));
                return (bytes, $"{flips} bit flips");
            default:
                var width = random.Next(2) == 0 ? 4 : 8;
                var where = Math.Min(Offset(), bytes.Length - width);
                byte[] extremes = [0x00, 0xFF, 0x7F, 0x80];
                var value = extremes[random.Next(extremes.Length)];
                bytes.AsSpan(where, width).Fill(value);
                return (bytes, $"{width} bytes of 0x{value:X2} at {where}");
        }
    }

    /// <summary>The stored dataset: its rows in every table that holds it, hashed.</summary>
    private async Task<string> FingerprintAsync()
    {
        await using var command = database.DataSource.CreateCommand("""
            SELECT concat_ws('/',
              (SELECT md5(string_agg(t::text, '|' ORDER BY t::text)) FROM dataset t WHERE slug = $1),
              (SELECT md5(string_agg(t::text, '|' ORDER BY t::text)) FROM dataset_year t JOIN dataset d USING (dataset_id) WHERE d.slug = $1),
              (SELECT md5(string_agg(t::text, '|' ORDER BY t::text)) FROM cell t JOIN dataset d USING (dataset_id) WHERE d.slug = $1),
              (SELECT md5(string_agg(t::text, '|' ORDER BY t::text)) FROM series_chunk t JOIN dataset d USING (dataset_id) WHERE d.slug = $1),
              (SELECT md5(string_agg(t::text, '|' ORDER BY t::text)) FROM source_file t JOIN dataset d USING (dataset_id) WHERE d.slug = $1))
            """);
        command.Parameters.AddWithValue(Slug);
        return (string)(await command.ExecuteScalarAsync())!;
    }
}
