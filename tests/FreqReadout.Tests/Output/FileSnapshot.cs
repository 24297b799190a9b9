using System.Security.Cryptography;

namespace FreqReadout.Tests.Output;

/// <summary>
/// The SHA-256 of every file in a folder (links listed by their target text, not followed), to show
/// that a failed command changed nothing: same names, same bytes, no temporary file left behind.
/// </summary>
internal sealed class FileSnapshot
{
    private readonly SortedDictionary<string, string> _entries;

    private FileSnapshot(SortedDictionary<string, string> entries) => _entries = entries;

    public static FileSnapshot Of(string folder)
    {
        var entries = new SortedDictionary<string, string>(StringComparer.Ordinal);
        foreach (string path in Directory.EnumerateFileSystemEntries(folder, "*", SearchOption.AllDirectories))
        {
            string name = Path.GetRelativePath(folder, path);
            var info = new FileInfo(path);
            if (info.LinkTarget != null)
            {
                entries[name] = "link -> " + info.LinkTarget;
            }
            else if (Directory.Exists(path))
            {
                entries[name] = "folder";
            }
            else
            {
                entries[name] = Sha256(path);
            }
        }

        return new FileSnapshot(entries);
    }

    public static string Sha256(string path)
    {
        using var stream = File.OpenRead(path);
        return Convert.ToHexString(SHA256.HashData(stream));
    }

    /// <summary>Fails naming every file added, removed or changed since <paramref name="before"/>.</summary>
    public static void AssertUnchanged(FileSnapshot before, string folder, string context)
    {
        FileSnapshot after = Of(folder);
        var problems = new List<string>();
        foreach (var (name, hash) in before._entries)
        {
            if (!after._entries.TryGetValue(name, out string? now))
            {
                problems.Add($"{name} removed");
            }
            else if (now != hash)
            {
                problems.Add($"{name} changed");
            }
        }

        foreach (string name in after._entries.Keys.Where(n => !before._entries.ContainsKey(n)))
        {
            problems.Add($"{name} added");
        }

        Assert.True(problems.Count == 0, $"{context}: {string.Join(", ", problems)}");
    }
}
