using System.Text.Json;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Simulation;

/// <summary><c>simulate --mains-ppm/--mains-hz</c> put mains pickup into the scene and the truth, and bad values are named.</summary>
[Collection(ConsoleCollection.Name)]
public sealed class SimulateMainsOptionTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-mains-").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    [Fact]
    public void MainsOptions_ReachTheTruthAndTheSavedScene()
    {
        string capture = Path.Combine(_dir, "m.csv");
        string truth = Path.Combine(_dir, "m.truth.json");
        string scene = Path.Combine(_dir, "m.scene.json");
        var (exit, _, stderr) = ConsoleCapture.Run("simulate", "--demo", "--duration-s", "1", "--mains-ppm", "5", "--mains-hz", "60", "--out", capture, "--truth", truth, "--save-scene", scene, "--quiet");
        Assert.True(exit == 0, stderr);
        using JsonDocument t = JsonDocument.Parse(File.ReadAllText(truth));
        Assert.Equal(5, t.RootElement.GetProperty("mains_deviation_ppm").GetDouble());
        Assert.Equal(60, t.RootElement.GetProperty("mains_hz").GetDouble());
        using JsonDocument s = JsonDocument.Parse(File.ReadAllText(scene));
        Assert.Equal(5, s.RootElement.GetProperty("mains").GetProperty("deviation_ppm").GetDouble());
    }

    [Fact]
    public void WithoutMains_TheTruthSaysNothingOfIt()
    {
        string capture = Path.Combine(_dir, "n.csv");
        var (exit, _, stderr) = ConsoleCapture.Run("simulate", "--demo", "--duration-s", "1", "--out", capture, "--quiet");
        Assert.True(exit == 0, stderr);
        // The truth file writes every key, null where it does not apply (docs/json-output.md).
        using var truth = System.Text.Json.JsonDocument.Parse(File.ReadAllText(capture + ".truth.json"));
        Assert.Equal(System.Text.Json.JsonValueKind.Null, truth.RootElement.GetProperty("mains_deviation_ppm").ValueKind);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, truth.RootElement.GetProperty("mains_hz").ValueKind);
    }

    [Theory]
    [InlineData("--mains-hz", "2000", "--mains-hz must be in [1, 1000] Hz")]
    [InlineData("--mains-ppm", "-3", "--mains-ppm must be in [0, 10000] ppm")]
    public void BadMainsValues_NameTheOption(string option, string value, string message)
    {
        var (exit, _, stderr) = ConsoleCapture.Run("simulate", "--demo", "--mains-ppm", "5", option, value, "--out", Path.Combine(_dir, "x.csv"), "--quiet");
        Assert.Equal(2, exit);
        Assert.Contains(message, stderr);
    }
}
