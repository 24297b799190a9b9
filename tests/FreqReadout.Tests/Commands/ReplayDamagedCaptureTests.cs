using FreqReadout.Tests.Docs;

namespace FreqReadout.Tests.Commands;

/// <summary>A capture damaged part-way: replay keeps what was read before the damage (nothing lost) and still fails.</summary>
public class ReplayDamagedCaptureTests
{
    [Fact]
    public void Replay_of_a_capture_damaged_mid_way_summarises_the_gates_before_it_and_exits_non_zero()
    {
        string dir = Directory.CreateTempSubdirectory("freqreadout-damaged-").FullName;
        try
        {
            CliProcess.Result sim = CliProcess.Run(dir, new[] { "simulate", "--demo", "--duration-s", "30", "--out", "whole.csv", "--quiet" });
            Assert.True(sim.ExitCode == 0, sim.Stderr);
            string[] lines = File.ReadAllLines(Path.Combine(dir, "whole.csv"));
            int bad = lines.Length / 2;
            lines[bad] = "12x34";
            File.WriteAllLines(Path.Combine(dir, "damaged.csv"), lines[..(bad + 1)]);

            CliProcess.Result r = CliProcess.Run(dir, new[] { "replay", "damaged.csv", "--json" });
            Assert.Equal(1, r.ExitCode);
            Assert.Contains($"damaged.csv:{bad + 1}:", r.Stderr); // the error names the line
            using var doc = System.Text.Json.JsonDocument.Parse(r.Stdout);
            Assert.True(doc.RootElement.GetProperty("gates").GetInt32() > 100, "the gates before the damage are summarised");
            Assert.Contains(doc.RootElement.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("the capture is damaged"));
        }
        finally
        {
            Directory.Delete(dir, recursive: true);
        }
    }
}
