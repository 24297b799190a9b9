using System.Globalization;
using System.Reflection;
using System.Text;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The settings a run used, as a <see cref="ReportTable"/> (setting, value, from): every public read-write property of
/// numbers, booleans and enums of the settings objects given, in declaration order, named in snake case
/// (ThresholdSigma -> threshold_sigma), numbers in invariant culture ("R"). Nothing is picked by hand, so a new setting
/// shows without a change here.
/// </summary>
public static class SettingsTable
{
    /// <summary>A table of the settings of <paramref name="sources"/>; each entry's name goes into the "from" column.</summary>
    public static ReportTable Of(params SettingsSource[] sources)
    {
        var table = new ReportTable("setting", "value", "from");
        foreach (SettingsSource source in sources)
        {
            foreach (PropertyInfo p in source.Settings.GetType().GetProperties(BindingFlags.Public | BindingFlags.Instance))
            {
                if (!p.CanRead || p.SetMethod?.IsPublic != true || p.GetIndexParameters().Length > 0)
                {
                    continue;
                }

                Type t = p.PropertyType;
                if (!(t.IsPrimitive || t.IsEnum || t == typeof(decimal)))
                {
                    continue;
                }

                table.AddRow(SnakeCase(p.Name), Text(p.GetValue(source.Settings)), source.Name);
            }
        }

        return table;
    }

    /// <summary>ThresholdSigma -> threshold_sigma (an underscore before every upper-case letter but the first, all lower case).</summary>
    public static string SnakeCase(string name)
    {
        var sb = new StringBuilder();
        for (int i = 0; i < name.Length; i++)
        {
            if (char.IsUpper(name[i]) && i > 0)
            {
                sb.Append('_');
            }

            sb.Append(char.ToLowerInvariant(name[i]));
        }

        return sb.ToString();
    }

    private static string Text(object? value) => value switch
    {
        null => "-",
        double d => d.ToString("R", CultureInfo.InvariantCulture),
        float f => f.ToString("R", CultureInfo.InvariantCulture),
        bool b => b ? "true" : "false",
        Enum e => SnakeCase(e.ToString()),
        IFormattable f => f.ToString(null, CultureInfo.InvariantCulture),
        _ => value.ToString() ?? "-",
    };
}
