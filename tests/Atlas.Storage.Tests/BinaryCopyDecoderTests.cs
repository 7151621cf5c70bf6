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

    private async Task<byte[]> CopyOutAsync(string query = Query)
    {
        await using var connection = await database.DataSource.OpenConnectionAsync();
        await using var copy = await connection.BeginRawBinaryCopyAsync(query);
        using var memory = new MemoryStream();
        await copy.CopyToAsync(memory);
        return memory.ToArray();
    }
}
