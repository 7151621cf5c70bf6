namespace Atlas.Storage.Series;

/// <summary>One stored cell-year: its packed payload (see <see cref="SeriesCodec"/>).</summary>
public sealed record SeriesChunk(int CellId, int Year, byte[] Payload);

/// <summary>A cell-year as it streams past: <see cref="Payload"/> is valid only until the stream moves on.</summary>
public readonly record struct StreamedSeriesChunk(int CellId, int Year, ReadOnlyMemory<byte> Payload);
