using System.Globalization;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

/// <summary>The simulator's material presets against the handbook table kept verbatim under Data/references.</summary>
public sealed class MaterialTableTests
{
    [Fact]
    public void Every_preset_has_the_conductivity_of_the_handbook_table()
    {
        // CRC Handbook of Chemistry and Physics, values from memory, as docs/references.md "Materials and temperature" gives them
        // (Data/references/materials-20c.csv, source in its header). Exact: the presets are the table's numbers.
        string path = Path.Combine(AppContext.BaseDirectory, "Data", "references", "materials-20c.csv");
        var rows = File.ReadAllLines(path)
            .Where(l => l.Length > 0 && !l.StartsWith('#'))
            .Skip(1) // column header
            .Select(l => l.Split(','))
            .ToList();
        Assert.Equal(MaterialPresets.Names.Count, rows.Count);
        foreach (string[] row in rows)
        {
            double sigma = double.Parse(row[2], NumberStyles.Float, CultureInfo.InvariantCulture);
            Assert.True(MaterialPresets.TryGet(row[0], null, out Material m), $"no preset {row[0]}");
            Assert.Equal(sigma, m.ConductivitySPerM);
            Assert.Contains(row[0], MaterialPresets.Names);
        }
    }
}
