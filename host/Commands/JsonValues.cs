using System.Text.Json;

namespace FreqReadout.Host.Commands;

/// <summary>Small helpers for the commands' --json output.</summary>
public static class JsonValues
{
    /// <summary>Writes <paramref name="value"/> as a number when it is a finite number, else null (a value that does not apply).</summary>
    public static void NumberOrNull(Utf8JsonWriter json, string name, double? value)
    {
        if (value is double v && double.IsFinite(v))
        {
            json.WriteNumber(name, v);
        }
        else
        {
            json.WriteNull(name);
        }
    }
}
