namespace FreqReadout.Host.Simulation;

/// <summary>
/// Material presets, 20 deg C: conductivities from docs/references.md "Materials and temperature" (CRC Handbook of Chemistry and Physics values,
/// from memory). Mild steel permeability is widely variable (tens to hundreds at low field), so it is a parameter with
/// default <see cref="DefaultSteelRelativePermeability"/>. Stainless 304 is austenitic: mu_r 1.
/// This table is separate from the check values of the polarizability tests, which use their own conductivities.
/// </summary>
public static class MaterialPresets
{
    /// <summary>Default initial relative permeability for carbon steel (a parameter; approximate).</summary>
    public const double DefaultSteelRelativePermeability = 100.0;

    /// <summary>Preset names accepted by <see cref="TryGet"/>.</summary>
    public static IReadOnlyList<string> Names { get; } = new[] { "silver", "copper", "aluminium", "brass", "cupronickel", "stainless", "carbon_steel" };

    /// <summary>
    /// Looks up a preset by name (case-insensitive; "aluminum", "steel", "cu_ni" accepted as aliases). For carbon steel
    /// <paramref name="relativePermeability"/> sets mu_r (null = default); for other presets a given mu_r overrides 1.
    /// </summary>
    public static bool TryGet(string name, double? relativePermeability, out Material material)
    {
        string key = name.Trim().ToLowerInvariant().Replace('-', '_').Replace(' ', '_');
        double sigma;
        double mur = 1.0;
        switch (key)
        {
            case "silver": sigma = 6.30e7; break;
            case "copper": sigma = 5.96e7; break;
            case "aluminium":
            case "aluminum": sigma = 3.77e7; key = "aluminium"; break;
            case "brass": sigma = 1.41e7; break; // 63 % Cu
            case "cupronickel":
            case "cu_ni": sigma = 5.2e6; key = "cupronickel"; break; // Cu-Ni 90/10
            case "stainless": sigma = 1.45e6; break; // 304
            case "carbon_steel":
            case "steel": sigma = 6.99e6; key = "carbon_steel"; mur = DefaultSteelRelativePermeability; break; // 1010
            default:
                material = new Material(name, double.NaN, double.NaN);
                return false;
        }

        if (relativePermeability.HasValue)
        {
            mur = relativePermeability.Value;
        }

        material = new Material(key, sigma, mur);
        return true;
    }
}
