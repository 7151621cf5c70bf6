using System.Globalization;

namespace Atlas.WavePhysics.Tests;

/// <summary>Reads the CSV reference tables under tests/data/physics (copied beside the test assembly).</summary>
internal static class ReferenceTable
{
    public static IReadOnlyList<Dictionary<string, double>> Read(string fileName)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "data", "physics", fileName);
        string[] lines = File.ReadAllLines(path);
        string[] header = lines[0].Split(',');
        var rows = new List<Dictionary<string, double>>();
        foreach (string line in lines.Skip(1).Where(l => l.Length > 0))
        {
            string[] cells = line.Split(',');
            var row = new Dictionary<string, double>();
            for (int i = 0; i < header.Length; i++) row[header[i]] = double.Parse(cells[i], CultureInfo.InvariantCulture);
            rows.Add(row);
        }
        return rows;
    }

    /// <summary>A two-column quantity,value table as a dictionary.</summary>
    public static Dictionary<string, double> ReadQuantities(string fileName)
    {
        string path = Path.Combine(AppContext.BaseDirectory, "data", "physics", fileName);
        return File.ReadAllLines(path).Skip(1).Where(l => l.Length > 0).Select(l => l.Split(','))
            .ToDictionary(c => c[0], c => double.Parse(c[1], CultureInfo.InvariantCulture));
    }
}
