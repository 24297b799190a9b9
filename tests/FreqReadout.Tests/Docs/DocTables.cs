using System.Text.Json;
using System.Text.RegularExpressions;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// Reads the key tables of the manual (docs/*.md): a table follows a marker line
/// <c>&lt;!-- keys: NAME --&gt;</c> or <c>&lt;!-- columns: NAME --&gt;</c>, and the first cell of each row holds the key
/// (or JSON path) in backticks. Also lists the key paths of real JSON output the same way the manual writes them.
/// </summary>
internal static class DocTables
{
    public static string Doc(string name) => File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "docs", name));

    /// <summary>The keys of the table after the marker <paramref name="marker"/> (e.g. "keys: count").</summary>
    public static SortedSet<string> Keys(string docName, string marker) => new(KeysInOrder(docName, marker), StringComparer.Ordinal);

    /// <summary>The keys of the table after the marker, in table order.</summary>
    public static List<string> KeysInOrder(string docName, string marker)
    {
        string[] lines = Doc(docName).Split('\n');
        int at = Array.FindIndex(lines, l => l.Trim() == $"<!-- {marker} -->");
        Assert.True(at >= 0, $"docs/{docName} has no marker <!-- {marker} -->");
        var keys = new List<string>();
        int i = at + 1;
        Assert.StartsWith("|", lines[i].Trim());
        i += 2; // header row and separator
        for (; i < lines.Length && lines[i].TrimStart().StartsWith('|'); i++)
        {
            string first = lines[i].Trim().Split('|', StringSplitOptions.None)[1];
            Match m = Regex.Match(first, "`([^`]+)`");
            Assert.True(m.Success, $"docs/{docName}: row without a `key` in its first cell: {lines[i]}");
            Assert.False(keys.Contains(m.Groups[1].Value), $"docs/{docName}: key {m.Groups[1].Value} listed twice under {marker}");
            keys.Add(m.Groups[1].Value);
        }

        Assert.True(keys.Count > 0, $"docs/{docName}: empty table under {marker}");
        return keys;
    }

    /// <summary>
    /// Adds every key path below <paramref name="element"/>, whose own path is <paramref name="path"/> ("" for the
    /// document): <c>a.b</c> inside objects, <c>a[].b</c> inside arrays of objects. Paths in <paramref name="opaque"/>
    /// are listed but not entered.
    /// </summary>
    public static void AddPaths(JsonElement element, string path, ISet<string> paths, params string[] opaque)
    {
        if (element.ValueKind == JsonValueKind.Object)
        {
            foreach (JsonProperty p in element.EnumerateObject())
            {
                string child = path.Length == 0 ? p.Name : path + "." + p.Name;
                paths.Add(child);
                if (Array.IndexOf(opaque, child) < 0)
                {
                    AddPaths(p.Value, child, paths, opaque);
                }
            }
        }
        else if (element.ValueKind == JsonValueKind.Array)
        {
            foreach (JsonElement item in element.EnumerateArray())
            {
                if (item.ValueKind == JsonValueKind.Object)
                {
                    AddPaths(item, path + "[]", paths, opaque);
                }
            }
        }
    }

    /// <summary>The paths of one JSON document, which must be an object.</summary>
    public static void AddDocument(string json, ISet<string> paths, params string[] opaque)
    {
        using JsonDocument doc = JsonDocument.Parse(json);
        Assert.Equal(JsonValueKind.Object, doc.RootElement.ValueKind);
        AddPaths(doc.RootElement, string.Empty, paths, opaque);
    }
}
