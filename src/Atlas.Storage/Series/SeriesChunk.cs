namespace Atlas.Storage.Series;

/// <summary>One stored cell-year: its packed payload (see <see cref="SeriesCodec"/>).</summary>
public sealed record SeriesChunk(int CellId, int Year, byte[] Payload);

/// <summary>
/// A cell-year whose <see cref="Payload"/> is a view of someone else's buffer: as it streams past a reader, valid only
/// until the stream moves on; handed to a COPY, kept unchanged until the COPY completes.
/// </summary>
public readonly record struct StreamedSeriesChunk(int CellId, int Year, ReadOnlyMemory<byte> Payload);
