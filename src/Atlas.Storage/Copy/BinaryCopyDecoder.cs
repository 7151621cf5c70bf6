using System.Buffers.Binary;
using System.Runtime.InteropServices;

namespace Atlas.Storage.Copy;

/// <summary>
/// Reads PostgreSQL's binary COPY format (the "Binary Format" section of the COPY page of the PostgreSQL manual) from a
/// raw COPY TO STDOUT stream, field by field, into one reusable buffer. Large fields (series chunks of tens of
/// kilobytes) are handed out as views of that buffer instead of fresh arrays, so streaming a whole dataset allocates
/// nothing per row; a view is valid until the next read.
/// </summary>
public sealed class BinaryCopyDecoder(Stream source)
{
    private static readonly byte[] Signature = [(byte)'P', (byte)'G', (byte)'C', (byte)'O', (byte)'P', (byte)'Y', 0x0A, 0xFF, 0x0D, 0x0A, 0x00];

    private const int Int4Oid = 23, Float4Oid = 700, Float8Oid = 701;   // pg_type oids of integer, real and double precision

    private byte[] _buffer = new byte[1 << 17];
    private int _start, _end;

    /// <summary>Checks the signature and skips the flags and the header extension.</summary>
    public async ValueTask ReadHeaderAsync(CancellationToken cancel = default)
    {
        await EnsureAsync(Signature.Length + 8, cancel);
        if (!_buffer.AsSpan(_start, Signature.Length).SequenceEqual(Signature))
            throw new InvalidDataException("The COPY stream does not start with PostgreSQL's binary COPY signature.");
        _start += Signature.Length + 4;
        var extension = TakeInt32();
        if (extension < 0) throw new InvalidDataException("The COPY stream has a negative header extension length.");
        await EnsureAsync(extension, cancel);
        _start += extension;
    }

    /// <summary>Starts the next row; false at the trailer. Throws when the row has another number of fields.</summary>
    public async ValueTask<bool> StartRowAsync(int expectedFields, CancellationToken cancel = default)
    {
        await EnsureAsync(2, cancel);
        var fields = BinaryPrimitives.ReadInt16BigEndian(_buffer.AsSpan(_start));
        _start += 2;
        if (fields == -1) return false;
        if (fields != expectedFields)
            throw new InvalidDataException($"A COPY row has {fields} fields where {expectedFields} were expected.");
        return true;
    }

    public async ValueTask<int> ReadInt32Async(CancellationToken cancel = default)
    {
        await FieldAsync(4, cancel);
        return TakeInt32();
    }

    public async ValueTask<short> ReadInt16Async(CancellationToken cancel = default)
    {
        await FieldAsync(2, cancel);
        var value = BinaryPrimitives.ReadInt16BigEndian(_buffer.AsSpan(_start));
        _start += 2;
        return value;
    }

    /// <summary>A non-null bytea field, as a view of the buffer valid until the next read.</summary>
    public async ValueTask<ReadOnlyMemory<byte>> ReadBytesAsync(CancellationToken cancel = default)
    {
        await EnsureAsync(4, cancel);
        var length = TakeInt32();
        if (length < 0) throw new InvalidDataException("A COPY field expected to hold bytes is NULL.");
        await EnsureAsync(length, cancel);
        var view = new ReadOnlyMemory<byte>(_buffer, _start, length);
        _start += length;
        return view;
    }

    /// <summary>
    /// A non-null bytea field of little-endian 32-bit floats (<see cref="BinaryCopyEncoder.WriteFloatBytes"/>), as a new
    /// array; a length that is not a multiple of four is refused.
    /// </summary>
    public async ValueTask<float[]> ReadFloatBytesAsync(string what, CancellationToken cancel = default)
    {
        var bytes = await ReadBytesAsync(cancel);
        if (bytes.Length % 4 != 0) throw new InvalidDataException($"{what} holds {bytes.Length} bytes, not whole 4-byte floats.");
        var values = MemoryMarshal.Cast<byte, float>(bytes.Span).ToArray();
        if (!BitConverter.IsLittleEndian)
        {
            var words = MemoryMarshal.Cast<float, int>(values.AsSpan());
            BinaryPrimitives.ReverseEndianness(words, words);
        }
        return values;
    }

    /// <summary>A one-dimensional integer[] field without NULL elements, or null for a NULL field.</summary>
    public ValueTask<int[]?> ReadInt32ArrayAsync(CancellationToken cancel = default) => ReadWordArrayAsync<int>(Int4Oid, "integer[]", cancel);

    /// <summary>A one-dimensional real[] field without NULL elements (NaN is a value), or null for a NULL field.</summary>
    public ValueTask<float[]?> ReadRealArrayAsync(CancellationToken cancel = default) => ReadWordArrayAsync<float>(Float4Oid, "real[]", cancel);

    /// <summary>A one-dimensional double precision[] field without NULL elements (NaN is a value), or null for a NULL field.</summary>
    public async ValueTask<double[]?> ReadDoubleArrayAsync(CancellationToken cancel = default)
    {
        var length = await ArrayLengthAsync(Float8Oid, 8, cancel);
        if (length < 0) return null;
        var values = new double[length];
        for (var i = 0; i < length; i++)
        {
            if (BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(_start)) != 8) throw new InvalidDataException("An element of a double precision[] field is not 8 bytes long.");
            values[i] = BinaryPrimitives.ReadDoubleBigEndian(_buffer.AsSpan(_start + 4));
            _start += 12;
        }
        return values;
    }

    // Both element types are 4-byte big-endian words: each is read as an integer and stored bit for bit.
    private async ValueTask<T[]?> ReadWordArrayAsync<T>(int elementOid, string typeName, CancellationToken cancel) where T : unmanaged
    {
        var length = await ArrayLengthAsync(elementOid, 4, cancel);
        if (length < 0) return null;
        var values = new T[length];
        var words = MemoryMarshal.Cast<T, int>(values.AsSpan());
        for (var i = 0; i < length; i++)
        {
            if (BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(_start)) != 4) throw new InvalidDataException($"An element of a {typeName} field is not 4 bytes long.");
            words[i] = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(_start + 4));
            _start += 8;
        }
        return values;
    }

    // Reads an array field's header ("array_send" layout: dimensions, has-nulls flag, element type, then per dimension
    // length and lower bound) and makes its whole body available; returns the element count, or -1 for NULL.
    private async ValueTask<int> ArrayLengthAsync(int elementOid, int elementBytes, CancellationToken cancel)
    {
        await EnsureAsync(4, cancel);
        var bytes = TakeInt32();
        if (bytes < 0) return -1;
        await EnsureAsync(bytes, cancel);
        var end = _start + bytes;
        var dimensions = TakeInt32();
        var hasNulls = TakeInt32() != 0;
        var oid = TakeInt32();
        if (hasNulls) throw new InvalidDataException("An array field has a NULL element.");
        if (dimensions == 0) { _start = end; return 0; }
        if (dimensions != 1 || oid != elementOid)
            throw new InvalidDataException($"An array field has {dimensions} dimensions of type {oid} where one of type {elementOid} was expected.");
        var length = TakeInt32();
        TakeInt32();   // lower bound
        if (length < 0 || _start + (4L + elementBytes) * length != end) throw new InvalidDataException("An array field's length disagrees with its size.");
        return length;
    }

    private async ValueTask FieldAsync(int length, CancellationToken cancel)
    {
        await EnsureAsync(4 + length, cancel);
        var stored = TakeInt32();
        if (stored != length)
            throw new InvalidDataException(stored < 0 ? "A COPY field expected to hold a number is NULL." : $"A COPY field has {stored} bytes where {length} were expected.");
    }

    private int TakeInt32()
    {
        var value = BinaryPrimitives.ReadInt32BigEndian(_buffer.AsSpan(_start));
        _start += 4;
        return value;
    }

    /// <summary>Makes at least <paramref name="count"/> unread bytes available, moving or growing the buffer as needed.</summary>
    private async ValueTask EnsureAsync(int count, CancellationToken cancel)
    {
        if (_end - _start >= count) return;
        if (count > _buffer.Length)
        {
            var larger = new byte[Math.Max(count, 2 * _buffer.Length)];
            _buffer.AsSpan(_start, _end - _start).CopyTo(larger);
            _buffer = larger;
        }
        else _buffer.AsSpan(_start, _end - _start).CopyTo(_buffer);
        _end -= _start;
        _start = 0;
        while (_end < count)
        {
            var read = await source.ReadAsync(_buffer.AsMemory(_end), cancel);
            if (read == 0) throw new EndOfStreamException("The COPY stream ended in the middle of a row.");
            _end += read;
        }
    }
}
