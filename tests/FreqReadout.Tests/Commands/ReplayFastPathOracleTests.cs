using System.Text;
using FreqReadout.Host.Bench;
using FreqReadout.Host.Captures;
using FreqReadout.Tests.Captures;
using FreqReadout.Tests.Robustness;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// replay and count print byte for byte the same (stdout, stderr, exit code) on the fast reading path as on the
/// line-based, row-by-row path kept as its oracle, on every capture of the test data (contract samples, regression
/// inputs) and on a synthetic capture in both formats, clean and damaged.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class ReplayFastPathOracleTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-oracle-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static (int Exit, string Out, string Err) Run(bool rowByRow, string[] args)
    {
        bool saved = CaptureFile.RowByRowReading;
        try
        {
            CaptureFile.RowByRowReading = rowByRow;
            return ConsoleCapture.RunMain(args);
        }
        finally
        {
            CaptureFile.RowByRowReading = saved;
        }
    }

    private static void AssertSameOutput(string path)
    {
        foreach (string[] args in new[]
        {
            new[] { "replay", path, "--json" },
            new[] { "replay", path },
            new[] { "count", path, "--json" },
        })
        {
            var oracle = Run(true, args);
            var fast = Run(false, args);
            string what = string.Join(' ', args.Select(a => a == path ? Path.GetFileName(path) : a));
            Assert.True(oracle.Exit == fast.Exit, $"{what}: exit {fast.Exit}, oracle {oracle.Exit}");
            Assert.True(oracle.Err == fast.Err, $"{what}: stderr differs:\n fast:   {fast.Err}\n oracle: {oracle.Err}");
            Assert.True(oracle.Out == fast.Out, $"{what}: stdout differs ({fast.Out.Length} / {oracle.Out.Length} chars)");
        }
    }

    [Fact]
    public void Replay_and_count_match_the_oracle_on_the_test_captures()
    {
        var files = Directory.GetFiles(CaptureTestFiles.ContractsDir, "*.csv")
            .Concat(Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "Data", FuzzRegressionFiles.Folder, "text")))
            .Concat(Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "Data", FuzzRegressionFiles.Folder, "binary")))
            .OrderBy(p => p, StringComparer.Ordinal);
        foreach (string path in files)
        {
            AssertSameOutput(path);
        }
    }

    [Fact]
    public void Replay_and_count_match_the_oracle_on_a_synthetic_capture_clean_and_damaged()
    {
        string text = Path.Combine(_dir, "synthetic.csv");
        string binary = Path.Combine(_dir, "synthetic.frb");
        SyntheticEdgeCapture.Write(text, 150_000, CaptureFileFormat.Text, prescale: 32);
        SyntheticEdgeCapture.Write(binary, 150_000, CaptureFileFormat.Binary, prescale: 32);
        byte[] textBytes = File.ReadAllBytes(text);
        byte[] binaryBytes = File.ReadAllBytes(binary);

        var variants = new Dictionary<string, byte[]>
        {
            ["synthetic.csv"] = textBytes,
            ["synthetic.frb"] = binaryBytes,
            ["crlf.csv"] = Encoding.UTF8.GetBytes(Encoding.UTF8.GetString(textBytes).Replace("\n", "\r\n")),
            ["cut-mid-row.csv"] = textBytes[..(int)(textBytes.Length * 0.6)],
            ["bad-row.csv"] = Insert(textBytes, (int)(textBytes.Length * 0.5), "12x4\n"),
            ["blank-and-comment.csv"] = Insert(Insert(textBytes, (int)(textBytes.Length * 0.7), "\n  \n"), (int)(textBytes.Length * 0.3), "# frames_lost = 3\n"),
            ["cut.frb"] = binaryBytes[..(int)(binaryBytes.Length * 0.6)],
            ["corrupt.frb"] = Flip(binaryBytes, (int)(binaryBytes.Length * 0.5)),
        };

        foreach (var (name, bytes) in variants)
        {
            string path = Path.Combine(_dir, name);
            File.WriteAllBytes(path, bytes);
            AssertSameOutput(path);
        }

        // The clean capture makes gates and finds the invented passes: the comparison is not between two empty outputs.
        var clean = Run(false, new[] { "replay", text, "--json" });
        Assert.Equal(0, clean.Exit);
        using var json = System.Text.Json.JsonDocument.Parse(clean.Out);
        Assert.True(json.RootElement.GetProperty("events").GetArrayLength() >= 3, "the invented passes are found");
    }

    /// <summary>Inserts text at the start of the line holding <paramref name="at"/>.</summary>
    private static byte[] Insert(byte[] bytes, int at, string text)
    {
        while (at > 0 && bytes[at - 1] != '\n')
        {
            at--;
        }

        return bytes[..at].Concat(Encoding.UTF8.GetBytes(text)).Concat(bytes[at..]).ToArray();
    }

    private static byte[] Flip(byte[] bytes, int at)
    {
        byte[] copy = (byte[])bytes.Clone();
        copy[at] ^= 0x5A;
        return copy;
    }
}
