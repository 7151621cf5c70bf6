namespace Atlas.Api.Catalog;

/// <summary>Every cell of a dataset, wet and dry, found by its cell id (a grid point index or a mesh node).</summary>
public sealed class CellTable
{
    private readonly CellRecord?[] _byId;

    public CellTable(IReadOnlyList<CellRecord> cells)
    {
        All = cells;
        _byId = new CellRecord?[cells.Count == 0 ? 0 : cells.Max(c => c.CellId) + 1];
        foreach (var cell in cells) _byId[cell.CellId] = cell;
    }

    /// <summary>The cells in the order the store gave them (by cell id).</summary>
    public IReadOnlyList<CellRecord> All { get; }

    /// <summary>The cell with this id, or null when the dataset has none.</summary>
    public CellRecord? Find(int cellId) => (uint)cellId < (uint)_byId.Length ? _byId[cellId] : null;
}
