using System.Buffers.Binary;
using System.Runtime.InteropServices;
using System.Runtime.CompilerServices;

namespace Atlas.Storage.Copy;

/// <summary>
/// Writes PostgreSQL's binary COPY format (the "Binary Format" section of the COPY page of the PostgreSQL manual:
/// signature, flags and extension length; per row a field count and length-prefixed big-endian fields; a -1
/// trailer) for a raw binary COPY stream. Hundreds of thousands of small rows go out several times faster than
/// through a typed importer's per-field calls; only the few column types the stores need are written.
/// </summary>
public sealed class BinaryCopyEncoder(Stream target)
{
    private const int Float4Oid = 700;  // pg_type oid of real
    private const int Int4Oid = 23;     // pg_type oid of integer
    private const int Float8Oid = 701;  // pg_type oid of double precision
    private static readonly byte[] Signature = [(byte)'P', (byte)'G', (byte)'C', (byte)'O', (byte)'P', (byte)'Y', 0x0A, 0xFF, 0x0D, 0x0A, 0x00];

    private readonly byte[] _buffer = new byte[1 << 16];
    private int _used;

    /// <summary>The signature, no flags and an empty header extension.</summary>
    public void WriteHeader()
    {
        Ensure(19);
        Signature.CopyTo(_buffer, _used);
        _used += Signature.Length;
        Int32Raw(0);
        Int32Raw(0);
    }

    public void StartRow(short fieldCount)
    {
        Ensure(2);
        BinaryPrimitives.WriteInt16BigEndian(_buffer.AsSpan(_used), fieldCount);
        _used += 2;
    }

    public void WriteInt32(int value)
    {
        Ensure(8);
        Int32Raw(4);
        Int32Raw(value);
    }

    public void WriteInt64(long value)
    {
        Ensure(12);
        Int32Raw(8);
        BinaryPrimitives.WriteInt64BigEndian(_buffer.AsSpan(_used), value);
        _used += 8;
    }

    public void WriteInt16(short value)
    {
        Ensure(6);
        Int32Raw(2);
        BinaryPrimitives.WriteInt16BigEndian(_buffer.AsSpan(_used), value);
        _used += 2;
    }

    /// <summary>A one-dimensional real[] (lower bound 1), or NULL for null.</summary>
    public void WriteRealArray(float[]? values)
    {
        if (values is null) { Ensure(4); Int32Raw(-1); return; }
        WriteRealArray(values.AsSpan());
    }

    /// <summary>A one-dimensional real[] (lower bound 1) of any length; NaN elements stay NaN.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void WriteRealArray(ReadOnlySpan<float> values)
    {
        ArrayHeader(Float4Oid, values.Length);
        foreach (var v in values)
        {
            Ensure(8);
            Int32Raw(4);
            BinaryPrimitives.WriteSingleBigEndian(_buffer.AsSpan(_used), v);
            _used += 4;
        }
    }

    /// <summary>
    /// A bytea field holding <paramref name="values"/> as little-endian 32-bit floats, four bytes each (NaN stays NaN):
    /// what <see cref="BinaryCopyDecoder.ReadFloatBytesAsync"/> reads back.
    /// </summary>
    public void WriteFloatBytes(ReadOnlySpan<float> values)
    {
        Ensure(4);
        Int32Raw(checked(4 * values.Length));
        for (var at = 0; at < values.Length;)
        {
            Ensure(4);
            var take = Math.Min(values.Length - at, (_buffer.Length - _used) / 4);
            var into = MemoryMarshal.Cast<byte, float>(_buffer.AsSpan(_used, 4 * take));
            values.Slice(at, take).CopyTo(into);
            if (!BitConverter.IsLittleEndian)
                BinaryPrimitives.ReverseEndianness(MemoryMarshal.Cast<float, int>(into), MemoryMarshal.Cast<float, int>(into));
            _used += 4 * take;
            at += take;
        }
    }

    /// <summary>A one-dimensional double precision[] (lower bound 1) of any length; NaN elements stay NaN.</summary>
    public void WriteDoubleArray(ReadOnlySpan<double> values)
    {
        ArrayHeader(Float8Oid, values.Length, 8);
        foreach (var v in values)
        {
            Ensure(12);
            Int32Raw(8);
            BinaryPrimitives.WriteDoubleBigEndian(_buffer.AsSpan(_used), v);
            _used += 8;
        }
    }

    /// <summary>A one-dimensional integer[] (lower bound 1) of any length.</summary>
    public void WriteInt32Array(ReadOnlySpan<int> values)
    {
        ArrayHeader(Int4Oid, values.Length);
        foreach (var v in values)
        {
            Ensure(8);
            Int32Raw(4);
            Int32Raw(v);
        }
    }

    // The field length, then the array header of the "array_send" layout: dimensions, has-nulls flag, element type,
    // and per dimension its length and lower bound. Elements follow, each length-prefixed.
    private void ArrayHeader(int elementOid, int length, int elementBytes = 4)
    {
        Ensure(24);
        Int32Raw(checked(20 + (4 + elementBytes) * length));
        Int32Raw(1);           // dimensions
        Int32Raw(0);           // no NULL elements
        Int32Raw(elementOid);
        Int32Raw(length);
        Int32Raw(1);           // lower bound
    }

    /// <summary>The -1 trailer, then everything buffered goes to the stream.</summary>
    public void WriteTrailer()
    {
        Ensure(2);
        BinaryPrimitives.WriteInt16BigEndian(_buffer.AsSpan(_used), -1);
        _used += 2;
        Flush();
    }

    private void Int32Raw(int value)
    {
        BinaryPrimitives.WriteInt32BigEndian(_buffer.AsSpan(_used), value);
        _used += 4;
    }

    private void Ensure(int bytes)
    {
        if (bytes > _buffer.Length) throw new ArgumentOutOfRangeException(nameof(bytes), bytes, "A field larger than the COPY buffer.");
        if (_used + bytes > _buffer.Length) Flush();
    }

    private void Flush()
    {
        target.Write(_buffer, 0, _used);
        _used = 0;
    }
}
