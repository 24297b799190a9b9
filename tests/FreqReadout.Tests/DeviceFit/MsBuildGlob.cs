using System.Text;
using System.Text.RegularExpressions;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Expands an MSBuild item's Include and Exclude patterns ("**", "*", "?", separators either way, ';' between
/// patterns) to the files they name, as full paths, so that projects can be compared by the files they compile.
/// </summary>
internal static class MsBuildGlob
{
    public static SortedSet<string> Expand(string projectDir, string include, string? exclude)
    {
        var files = new SortedSet<string>(StringComparer.Ordinal);
        foreach (string pattern in Split(include))
        {
            foreach (string file in Match(projectDir, pattern))
            {
                files.Add(file);
            }
        }

        foreach (string pattern in Split(exclude))
        {
            foreach (string file in Match(projectDir, pattern))
            {
                files.Remove(file);
            }
        }

        return files;
    }

    private static IEnumerable<string> Split(string? patterns)
    {
        return (patterns ?? string.Empty).Split(';', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
    }

    private static IEnumerable<string> Match(string projectDir, string pattern)
    {
        string[] segments = pattern.Replace('\\', '/').Split('/');
        int firstWild = Array.FindIndex(segments, s => s.Contains('*') || s.Contains('?'));
        if (firstWild < 0)
        {
            string single = Path.GetFullPath(Path.Combine(projectDir, pattern.Replace('\\', '/')));
            return File.Exists(single) ? new[] { single } : Array.Empty<string>();
        }

        string root = Path.GetFullPath(Path.Combine(projectDir, string.Join("/", segments.Take(firstWild))));
        if (!Directory.Exists(root))
        {
            return Array.Empty<string>();
        }

        var regex = new StringBuilder("^");
        for (int i = firstWild; i < segments.Length; i++)
        {
            string segment = segments[i];
            bool last = i == segments.Length - 1;
            if (segment == "**")
            {
                regex.Append(last ? ".*" : "(?:[^/]+/)*");
                continue;
            }

            regex.Append(Regex.Escape(segment).Replace(@"\*", "[^/]*").Replace(@"\?", "[^/]"));
            if (!last)
            {
                regex.Append('/');
            }
        }

        var match = new Regex(regex.Append('$').ToString());
        return Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories)
            .Where(f => match.IsMatch(Path.GetRelativePath(root, f).Replace('\\', '/')))
            .Select(Path.GetFullPath);
    }
}
