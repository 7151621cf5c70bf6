namespace Atlas.Storage.Series;

/// <summary>One stored cell-year: its packed payload (see <see cref="SeriesCodec"/>).</summary>
public sealed record SeriesChunk(int CellId, int Year, byte[] Payload);
