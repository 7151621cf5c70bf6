using Atlas.Storage.Copy;
using Atlas.TestSupport;

namespace Atlas.Storage.Tests;

/// <summary>
/// The binary COPY reader against PostgreSQL's own COPY TO STDOUT (FORMAT BINARY) output, and against damaged streams.
/// </summary>
public class BinaryCopyDecoderTests(TestDatabase database) : IClassFixture<TestDatabase>
{
    private const string Query = """
        COPY (SELECT g AS cell, (2000 + g)::smallint AS year,
                     CASE WHEN g = 3 THEN NULL ELSE decode(repeat(lpad(to_hex(g), 2, '0'), 1000 * g), 'hex') END AS payload
                FROM generate_series(1, 300) g ORDER BY g) TO STDOUT (FORMAT BINARY)
        """;

    [Fact]
    public async Task RowsComeBackAsPostgreSqlWroteThemWithFieldsLargerThanTheBuffer()
    {
        var bytes = await CopyOutAsync();
        var decoder = new BinaryCopyDecoder(new MemoryStream(bytes));
        await decoder.ReadHeaderAsync();
        for (var g = 1; g <= 2; g++)
        {
            Assert.True(await decoder.StartRowAsync(3));
            Assert.Equal(g, await decoder.ReadInt32Async());
            Assert.Equal(2000 + g, await decoder.ReadInt16Async());
            var payload = await decoder.ReadBytesAsync();
            Assert.Equal(1000 * g, payload.Length);
            Assert.True(payload.Span.IndexOfAnyExcept((byte)g) < 0);
        }
        Assert.True(await decoder.StartRowAsync(3));
        await decoder.ReadInt32Async();
        await decoder.ReadInt16Async();
        var error = await Assert.ThrowsAsync<InvalidDataException>(async () => await decoder.ReadBytesAsync());
        Assert.Contains("NULL", error.Message);
    }

    [Fact]
    public async Task AStreamCutShortOrOfAnotherShapeIsRefusedByName()
    {
        var bytes = await CopyOutAsync();
        // Row 300 holds 300,000 bytes, more than the reader's first buffer: the buffer grows to take it whole.
        var decoder = new BinaryCopyDecoder(new MemoryStream(bytes));
        await decoder.ReadHeaderAsync();
        var rows = 0;
        while (await decoder.StartRowAsync(3))
        {
            var g = await decoder.ReadInt32Async();
            await decoder.ReadInt16Async();
            if (g != 3) Assert.Equal(1000 * g, (await decoder.ReadBytesAsync()).Length);
            else await Assert.ThrowsAsync<InvalidDataException>(async () => await decoder.ReadBytesAsync());
            rows++;
        }
        Assert.Equal(300, rows);

        var cut = new BinaryCopyDecoder(new MemoryStream(bytes[..(bytes.Length / 2)]));
        await cut.ReadHeaderAsync();
        await Assert.ThrowsAsync<EndOfStreamException>(async () =>
        {
            while (await cut.StartRowAsync(3))
            {
                var g = await cut.ReadInt32Async();
                await cut.ReadInt16Async();
                if (g != 3) await cut.ReadBytesAsync();
                else await Assert.ThrowsAsync<InvalidDataException>(async () => await cut.ReadBytesAsync());
            }
        });

        var other = new BinaryCopyDecoder(new MemoryStream(bytes));
        await other.ReadHeaderAsync();
        Assert.Contains("3 fields where 2", (await Assert.ThrowsAsync<InvalidDataException>(async () => await other.StartRowAsync(2))).Message);
        var notCopy = new BinaryCopyDecoder(new MemoryStream("cell,year,payload\n1,2000,0a0b\n2,2001,0c\n"u8.ToArray()));
        Assert.Contains("signature", (await Assert.ThrowsAsync<InvalidDataException>(async () => await notCopy.ReadHeaderAsync())).Message);
    }

    [Fact]
    public async Task ArraysComeBackWholeWithNaNAndNullArraysAndRefuseNullElements()
    {
        var bytes = await CopyOutAsync("""
            COPY (SELECT ARRAY[1, -2, 2147483647]::int[], ARRAY[1.5, 'NaN', -0.25]::real[], NULL::real[], '{}'::int[],
                         ARRAY[1, NULL]::int[], ARRAY[[1.0]]::real[]) TO STDOUT (FORMAT BINARY)
            """);
        var decoder = new BinaryCopyDecoder(new MemoryStream(bytes));
        await decoder.ReadHeaderAsync();
        Assert.True(await decoder.StartRowAsync(6));
        var ints = await decoder.ReadInt32ArrayAsync();
        Assert.Equal(new[] { 1, -2, int.MaxValue }, ints);
        var reals = (await decoder.ReadRealArrayAsync())!;
        Assert.Equal(3, reals.Length);
        Assert.True(reals[0] == 1.5f && float.IsNaN(reals[1]) && reals[2] == -0.25f);
        Assert.Null(await decoder.ReadRealArrayAsync());
        Assert.Empty((await decoder.ReadInt32ArrayAsync())!);
        Assert.Contains("NULL element", (await Assert.ThrowsAsync<InvalidDataException>(async () => await decoder.ReadInt32ArrayAsync())).Message);
    }

    [Theory]
    [InlineData("ARRAY[[1.0, 2.0]]::real[]", "2 dimensions")]
    [InlineData("ARRAY[1.0]::real[]", "of type 700 where one of type 23")]
    public async Task AnArrayOfAnotherShapeOrTypeIsRefused(string array, string message)
    {
        var bytes = await CopyOutAsync($"COPY (SELECT {array}) TO STDOUT (FORMAT BINARY)");
        var decoder = new BinaryCopyDecoder(new MemoryStream(bytes));
        await decoder.ReadHeaderAsync();
        Assert.True(await decoder.StartRowAsync(1));
        Assert.Contains(message, (await Assert.ThrowsAsync<InvalidDataException>(async () => await decoder.ReadInt32ArrayAsync())).Message);
    }

    // Packed floats (the output points' per-step values): written by the encoder through PostgreSQL's COPY FROM into a
    // bytea column, the stored bytes read by NumPy as little-endian float32 (numpy.frombuffer, dtype '<f4') give the same
    // values bit for bit, and the decoder reads them back alike; 40,000 values span the encoder's 64 KB buffer.
    [Fact]
    public async Task PackedFloatsGoThroughPostgreSqlAsNumPyReadsThem()
    {
        var values = Enumerable.Range(0, 40_000).Select(i => i switch
        {
            0 => float.NaN, 1 => -0f, 2 => float.Epsilon, 3 => float.MaxValue, 4 => float.NegativeInfinity,
            _ => (float)Math.Sin(i) * i,
        }).ToArray();
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using (var create = new Npgsql.NpgsqlCommand("CREATE TEMP TABLE packed (v bytea)", connection)) await create.ExecuteNonQueryAsync();
        await using (var copy = await connection.BeginRawBinaryCopyAsync("COPY packed (v) FROM STDIN (FORMAT BINARY)"))
        {
            var encoder = new BinaryCopyEncoder(copy);
            encoder.WriteHeader();
            encoder.StartRow(1);
            encoder.WriteFloatBytes(values);
            encoder.WriteTrailer();
        }
        string hex;
        await using (var select = new Npgsql.NpgsqlCommand("SELECT encode(v, 'hex') FROM packed", connection)) hex = (string)(await select.ExecuteScalarAsync())!;
        var path = Path.Combine(Path.GetTempPath(), $"atlas-packed-{Guid.NewGuid():N}.hex");
        try
        {
            await File.WriteAllTextAsync(path, hex);
            using var python = System.Diagnostics.Process.Start(new System.Diagnostics.ProcessStartInfo("/usr/bin/python3",
                ["-c", "import sys, numpy as np; v = np.frombuffer(bytes.fromhex(open(sys.argv[1]).read()), dtype='<f4'); " +
                       "print(len(v)); print(' '.join(str(int(x)) for x in v.view('<u4')[:5])); print(int(v.view('<u4').astype(np.uint64).sum()))", path])
                { RedirectStandardOutput = true })!;
            var lines = (await python.StandardOutput.ReadToEndAsync()).Split('\n');
            await python.WaitForExitAsync();
            var bits = values.Select(v => (ulong)BitConverter.SingleToUInt32Bits(v)).ToArray();
            Assert.Equal(values.Length.ToString(), lines[0]);
            Assert.Equal(string.Join(' ', bits.Take(5)), lines[1]);
            Assert.Equal(bits.Aggregate(0UL, (a, b) => a + b).ToString(), lines[2]);
        }
        finally
        {
            File.Delete(path);
        }
        var back = new BinaryCopyDecoder(new MemoryStream(await CopyOutAsync("COPY packed (v) TO STDOUT (FORMAT BINARY)", connection)));
        await back.ReadHeaderAsync();
        Assert.True(await back.StartRowAsync(1));
        var read = await back.ReadFloatBytesAsync("packed");
        Assert.Equal(values.Select(BitConverter.SingleToUInt32Bits), read.Select(BitConverter.SingleToUInt32Bits));
    }

    private async Task<byte[]> CopyOutAsync(string query, Npgsql.NpgsqlConnection connection)
    {
        await using var copy = await connection.BeginRawBinaryCopyAsync(query);
        using var memory = new MemoryStream();
        await copy.CopyToAsync(memory);
        return memory.ToArray();
    }

    private async Task<byte[]> CopyOutAsync(string query = Query)
    {
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using var copy = await connection.BeginRawBinaryCopyAsync(query);
        using var memory = new MemoryStream();
        await copy.CopyToAsync(memory);
        return memory.ToArray();
    }
}
