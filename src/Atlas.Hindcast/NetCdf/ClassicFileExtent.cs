using System.Buffers.Binary;

namespace Atlas.Hindcast;

/// <summary>
/// The number of bytes a classic-model file (CDF-1, CDF-2, CDF-5) must have for all the data its header describes,
/// from the header layout of the NetCDF Classic Format Specification. netCDF-C opens a classic file whose data
/// were cut short and reads the missing part as zeros, so a truncated file has to be caught by its size.
/// </summary>
internal static class ClassicFileExtent
{
    private const int NcDimension = 10, NcVariable = 11, NcAttribute = 12;

    /// <summary>
    /// Bytes required by the header of <paramref name="path"/>, or null when the file is not a classic-model file or its
    /// record count is "streaming" (unknown). Throws <see cref="HindcastFormatException"/> when the header itself is cut.
    /// </summary>
    public static long? RequiredBytes(string path)
    {
        using var stream = File.OpenRead(path);
        var reader = new HeaderReader(stream, path);
        if (reader.Byte() != 'C' || reader.Byte() != 'D' || reader.Byte() != 'F') return null;
        int version = reader.Byte();
        if (version is not (1 or 2 or 5)) return null;
        reader.Version = version;

        long numrecs = reader.Size();
        if (numrecs == (version == 5 ? -1L : 0xFFFF_FFFFL)) return null;

        // Sizes multiply and add up from untrusted header fields: any overflow means a damaged header.
        try
        {
            checked
            {
                var dims = new List<long>();
                long recordDim = -1;
                foreach (var _ in reader.List(NcDimension))
                {
                    reader.Name();
                    long length = reader.Size();
                    if (length == 0) recordDim = dims.Count;
                    dims.Add(length);
                }
                SkipAttributes(reader);

                long required = reader.Position;
                long recordSize = 0;
                var records = new List<(long Begin, long OneRecord)>();
                foreach (var _ in reader.List(NcVariable))
                {
                    reader.Name();
                    long rank = reader.Size();
                    if (rank < 0 || rank > dims.Count) throw Corrupt(path, $"a variable with {rank} dimensions where {dims.Count} are defined");
                    var ids = new long[rank];
                    for (int d = 0; d < rank; d++)
                        if ((ids[d] = reader.Size()) < 0 || ids[d] >= dims.Count) throw Corrupt(path, $"dimension id {ids[d]} where {dims.Count} are defined");
                    SkipAttributes(reader);
                    int type = reader.Int32();
                    reader.VarSize();
                    long begin = reader.Offset();
                    long bytes = TypeSize(type, path);
                    bool isRecord = rank > 0 && ids[0] == recordDim;
                    for (int d = isRecord ? 1 : 0; d < rank; d++) bytes *= dims[(int)ids[d]];
                    if (isRecord)
                    {
                        records.Add((begin, bytes));
                        recordSize += Pad4(bytes);
                    }
                    else required = Math.Max(required, begin + bytes);
                }
                // With a single record variable the records are not padded (the classic-format special case).
                if (records.Count == 1) recordSize = records[0].OneRecord;
                if (numrecs > 0)
                    foreach (var (begin, one) in records)
                        required = Math.Max(required, begin + (numrecs - 1) * recordSize + one);
                return required;
            }
        }
        catch (OverflowException)
        {
            throw Corrupt(path, "sizes that overflow");
        }
    }

    private static void SkipAttributes(HeaderReader reader)
    {
        foreach (var _ in reader.List(NcAttribute))
        {
            reader.Name();
            int type = reader.Int32();
            long count = reader.Size();
            long size = TypeSize(type, reader.Path);
            // A count past the end of the file is caught by Skip; one so large its byte size overflows, here.
            if (count > long.MaxValue / 8) throw Corrupt(reader.Path, $"an attribute of {count} values");
            reader.Skip(Pad4(count * size));
        }
    }

    private static long TypeSize(int type, string path) => type switch
    {
        1 or 2 or 7 => 1,
        3 or 8 => 2,
        4 or 5 or 9 => 4,
        6 or 10 or 11 => 8,
        _ => throw new HindcastFormatException(path, null, $"corrupt classic header: unknown type code {type}"),
    };

    private static HindcastFormatException Corrupt(string path, string what) => new(path, null, $"corrupt classic header: {what}");

    private static long Pad4(long n) => (n + 3) & ~3L;

    private sealed class HeaderReader(Stream stream, string path)
    {
        private readonly byte[] _buffer = new byte[8];

        public string Path => path;
        public int Version { get; set; }
        public long Position => stream.Position;

        public int Byte()
        {
            int b = stream.ReadByte();
            if (b < 0) throw Cut();
            return b;
        }

        public int Int32()
        {
            Fill(4);
            return BinaryPrimitives.ReadInt32BigEndian(_buffer);
        }

        public long Int64()
        {
            Fill(8);
            return BinaryPrimitives.ReadInt64BigEndian(_buffer);
        }

        /// <summary>Counts and lengths: 32-bit unsigned, 64-bit in CDF-5.</summary>
        public long Size() => Version == 5 ? Int64() : (uint)Int32();

        /// <summary>vsize: 32-bit in CDF-1/2 (and capped there for huge variables), 64-bit in CDF-5.</summary>
        public long VarSize() => Version == 5 ? Int64() : (uint)Int32();

        /// <summary>begin: 32-bit in CDF-1, 64-bit in CDF-2 and CDF-5.</summary>
        public long Offset() => Version == 1 ? (uint)Int32() : Int64();

        public void Name()
        {
            long length = Size();
            if (length > stream.Length) throw Cut();
            Skip(Pad4(length));
        }

        public void Skip(long bytes)
        {
            if (bytes < 0 || bytes > stream.Length - stream.Position) throw Cut();
            stream.Seek(bytes, SeekOrigin.Current);
        }

        /// <summary>A tagged list: ABSENT (two zeros) or tag, count, items.</summary>
        public IEnumerable<long> List(int expectedTag)
        {
            int tag = Int32();
            long count = Size();
            if (tag == 0 && count == 0) yield break;
            if (tag != expectedTag || count < 0)
                throw new HindcastFormatException(path, null, $"corrupt classic header: list tag {tag} where {expectedTag} was expected");
            for (long k = 0; k < count; k++) yield return k;
        }

        private void Fill(int n)
        {
            if (stream.ReadAtLeast(_buffer.AsSpan(0, n), n, throwOnEndOfStream: false) < n) throw Cut();
        }

        private HindcastFormatException Cut() =>
            new(path, null, "truncated or damaged: the header runs past the end of the file (cut short, or a count or length in it is wrong)");
    }
}
