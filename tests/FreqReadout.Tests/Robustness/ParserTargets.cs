using System.Text;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Robustness;

/// <summary>The parsers under fuzz and their seed inputs.</summary>
public static class ParserTargets
{
    /// <summary>Rows read per input at most: bounds the work (and memory) of an input that duplicates rows.</summary>
    public const int RowCap = 10_000;

    private static string DataFolder(string sub) => Path.Combine(AppContext.BaseDirectory, "Data", sub);

    /// <summary>The contract samples (valid and bad-*), as bytes.</summary>
    public static IReadOnlyList<byte[]> ContractSamples() =>
        Directory.GetFiles(DataFolder("contracts"), "*.csv").OrderBy(p => p, StringComparer.Ordinal).Select(File.ReadAllBytes).ToList();

    /// <summary>The valid contract samples converted to binary captures by the host's writer.</summary>
    public static IReadOnlyList<byte[]> BinarySamples()
    {
        var result = new List<byte[]>();
        foreach (string path in Directory.GetFiles(DataFolder("contracts"), "*.csv").Where(p => !Path.GetFileName(p).StartsWith("bad-", StringComparison.Ordinal)).OrderBy(p => p, StringComparer.Ordinal))
        {
            using var reader = CaptureFile.Open(path);
            var stream = new MemoryStream();
            using (var writer = CaptureFile.Create(stream, reader.Metadata, CaptureFileFormat.Binary))
            {
                foreach (var row in reader.ReadRows())
                {
                    writer.WriteRow(row);
                }

                writer.Complete(reader.Trailer);
            }

            result.Add(stream.ToArray());
        }

        return result;
    }

    /// <summary>The shipped scenes (host/Scenes, copied to the output by the host project) and the built-in demo scene.</summary>
    public static IReadOnlyList<byte[]> SceneSamples()
    {
        var result = Directory.GetFiles(Path.Combine(AppContext.BaseDirectory, "Scenes"), "*.json").OrderBy(p => p, StringComparer.Ordinal).Select(File.ReadAllBytes).ToList();
        result.Add(Encoding.UTF8.GetBytes(DemoScenes.FloorScan().ToJson()));
        return result;
    }

    public static ParserTarget Text() => new("text", ContractSamples(), typeof(CaptureFormatException), bytes =>
    {
        using var reader = new TextCaptureReader(new MemoryStream(bytes, writable: false), "fuzz");
        Drain(reader);
    });

    public static ParserTarget Binary() => new("binary", BinarySamples(), typeof(CaptureFormatException), bytes =>
    {
        using var reader = new BinaryCaptureReader(new MemoryStream(bytes, writable: false), "fuzz");
        Drain(reader);
    })
    { BlockAware = true };

    /// <summary>The entry point of `simulate --scene` and `coil --scene` (Scene.Load reads the file as UTF-8 text, then Scene.Parse).</summary>
    public static ParserTarget Scene() => new("scene", SceneSamples(), typeof(SceneException), bytes =>
    {
        string text;
        using (var sr = new StreamReader(new MemoryStream(bytes, writable: false), Encoding.UTF8, detectEncodingFromByteOrderMarks: true))
        {
            text = sr.ReadToEnd();
        }

        FreqReadout.Host.Simulation.Scene.Parse(text, "fuzz.json");
    });

    public static ParserTarget ByName(string name) => name switch
    {
        "text" => Text(),
        "binary" => Binary(),
        "scene" => Scene(),
        _ => throw new ArgumentException($"no parser target named {name}", nameof(name)),
    };

    private static void Drain(ICaptureReader reader)
    {
        _ = reader.Metadata;
        int n = 0;
        foreach (var row in reader.ReadRows())
        {
            if (++n >= RowCap)
            {
                return;
            }
        }

        _ = reader.Trailer.Count;
        _ = reader.Warnings.Count;
    }
}
