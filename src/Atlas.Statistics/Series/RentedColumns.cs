using System.Buffers;

namespace Atlas.Statistics.Series;

/// <summary>
/// Copies of series in arrays rented from the shared pool, given back on <see cref="Dispose"/>: work handed to
/// other threads can hold an array, not a span of the caller's buffers.
/// </summary>
internal sealed class RentedColumns : IDisposable
{
    private readonly List<float[]> _rented = [];

    /// <summary>A copy of the values (the array may be longer: read its first values.Length); null when the series is absent (empty).</summary>
    public float[]? Copy(ReadOnlySpan<float> values)
    {
        if (values.IsEmpty) return null;
        float[] copy = ArrayPool<float>.Shared.Rent(values.Length);
        values.CopyTo(copy);
        _rented.Add(copy);
        return copy;
    }

    public void Dispose()
    {
        foreach (float[] array in _rented) ArrayPool<float>.Shared.Return(array);
        _rented.Clear();
    }
}
