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

    /// <summary>
    /// One JSON document as text: <paramref name="body"/> writes it (with the options replay uses: no escaping of
    /// non-ASCII text), the writer is flushed and its UTF-8 bytes decoded.
    /// </summary>
    internal static string Document(Action<Utf8JsonWriter> body)
    {
        using var stream = new MemoryStream();
        using (var w = new Utf8JsonWriter(stream, ReplayCommand.JsonOptions))
        {
            body(w);
        }

        return System.Text.Encoding.UTF8.GetString(stream.ToArray());
    }
}
