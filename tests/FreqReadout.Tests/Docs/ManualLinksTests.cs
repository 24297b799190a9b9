using System.Text.RegularExpressions;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// The manual is self-contained: every relative link in the project's Markdown resolves to a file of the
/// repository (and a heading, when it names one), the README and DEVELOPERS link to it, and nothing points
/// to documents a user of the repository does not have.
/// </summary>
public sealed class ManualLinksTests
{
    // The sibling folder the project was briefed from, which users of the repository do not have (built, not written out whole, so this file is not itself a pointer to it).
    private static readonly string ParentShared = "../" + "shared/";
    private static readonly string BriefFolder = "shared/" + "brief";

    /// <summary>The project's own Markdown (docs/contracts/README.md is a verbatim copy and keeps its original words).</summary>
    private static IEnumerable<string> ProjectMarkdown()
    {
        string root = CliProcess.RepoRoot();
        var files = new List<string> { Path.Combine(root, "README.md"), Path.Combine(root, "DEVELOPERS.md"), Path.Combine(root, "host", "Scenes", "README.md") };
        files.AddRange(Directory.GetFiles(Path.Combine(root, "docs"), "*.md", SearchOption.AllDirectories));
        files.AddRange(Directory.GetFiles(Path.Combine(root, "hardware-notes"), "*.md", SearchOption.AllDirectories));
        return files.Where(f => !f.EndsWith(Path.Combine("docs", "contracts", "README.md"), StringComparison.Ordinal));
    }

    /// <summary>GitHub's anchor of a heading: lower case, punctuation other than '-' and '_' dropped, spaces as '-'.</summary>
    internal static string Anchor(string heading)
    {
        string lower = heading.Trim().ToLowerInvariant();
        var kept = lower.Where(c => char.IsLetterOrDigit(c) || c is ' ' or '-' or '_').ToArray();
        return new string(kept).Replace(' ', '-');
    }

    [Fact]
    public void Every_relative_link_resolves_to_a_file_and_heading_of_the_repository()
    {
        var problems = new List<string>();
        int links = 0;
        foreach (string file in ProjectMarkdown())
        {
            string text = File.ReadAllText(file);
            foreach (Match m in Regex.Matches(text, @"\]\((?<target>[^)\s]+)\)"))
            {
                string target = m.Groups["target"].Value;
                if (target.StartsWith("http", StringComparison.Ordinal) || target.StartsWith("mailto:", StringComparison.Ordinal))
                {
                    continue;
                }

                links++;
                string[] parts = target.Split('#', 2);
                string path = parts[0].Length == 0 ? file : Path.GetFullPath(Path.Combine(Path.GetDirectoryName(file)!, parts[0]));
                string where = Path.GetRelativePath(CliProcess.RepoRoot(), file) + " -> " + target;
                if (!File.Exists(path) && !Directory.Exists(path))
                {
                    problems.Add(where + ": no such file");
                    continue;
                }

                if (!path.StartsWith(CliProcess.RepoRoot(), StringComparison.Ordinal))
                {
                    problems.Add(where + ": outside the repository");
                }

                if (parts.Length == 2 && path.EndsWith(".md", StringComparison.Ordinal))
                {
                    var anchors = File.ReadLines(path).Where(l => l.StartsWith('#')).Select(l => Anchor(l.TrimStart('#'))).ToHashSet();
                    if (!anchors.Contains(parts[1]))
                    {
                        problems.Add(where + ": no heading with that anchor");
                    }
                }
            }
        }

        Assert.True(links > 50, "expected the manual's links, found " + links);
        Assert.True(problems.Count == 0, string.Join("\n", problems));
    }

    [Fact]
    public void README_and_DEVELOPERS_link_to_the_manual_and_the_index_links_every_page()
    {
        string root = CliProcess.RepoRoot();
        Assert.Contains("(docs/README.md)", File.ReadAllText(Path.Combine(root, "README.md")));
        Assert.Contains("(docs/README.md)", File.ReadAllText(Path.Combine(root, "DEVELOPERS.md")));
        Assert.Contains("(docs/capture-text-format.md)", File.ReadAllText(Path.Combine(root, "README.md")));
        string index = File.ReadAllText(Path.Combine(root, "docs", "README.md"));
        foreach (string page in Directory.GetFiles(Path.Combine(root, "docs"), "*.md").Select(Path.GetFileName))
        {
            if (page != "README.md")
            {
                Assert.True(index.Contains("(" + page + ")", StringComparison.Ordinal), "docs/README.md does not link " + page);
            }
        }
    }

    [Fact]
    public void Nothing_points_to_documents_outside_the_repository()
    {
        // The product brief, the reference list and the contract samples' original folder are not part of the
        // repository: the project's docs replace them. Allowed: the verbatim contract README and the note on its origin.
        string root = CliProcess.RepoRoot();
        string self = Path.Combine("tests", "FreqReadout.Tests", "Docs", "ManualLinksTests.cs");
        string[] allowed = { Path.Combine("docs", "contracts", "README.md"), Path.Combine("docs", "contracts", "ORIGIN.md"), self };
        var hits = new List<string>();
        foreach (string file in Directory.EnumerateFiles(root, "*", SearchOption.AllDirectories))
        {
            string rel = Path.GetRelativePath(root, file);
            string[] dirs = rel.Split(Path.DirectorySeparatorChar);
            if (dirs.Any(d => d is "bin" or "obj" or ".git" or "BenchmarkDotNet.Artifacts") || allowed.Contains(rel))
            {
                continue;
            }

            string ext = Path.GetExtension(file);
            if (ext is not (".md" or ".cs" or ".csproj" or ".json" or ".csv" or ".txt" or ".props" or ".nfproj" or ".config" or ""))
            {
                continue;
            }

            int n = 0;
            foreach (string line in File.ReadLines(file))
            {
                n++;
                if (line.Contains(ParentShared, StringComparison.Ordinal) || line.Contains(BriefFolder, StringComparison.Ordinal)
                    || line.Contains("PRODUCT.md", StringComparison.Ordinal) || line.Contains("REFERENCES.md", StringComparison.Ordinal))
                {
                    hits.Add($"{rel}:{n}: {line.Trim()}");
                }
            }
        }

        Assert.True(hits.Count == 0, "pointers to documents users do not have (point to docs/ instead):\n" + string.Join("\n", hits));
    }
}
