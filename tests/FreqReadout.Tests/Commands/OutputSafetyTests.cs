using FreqReadout.Host.Output;
using FreqReadout.Tests.Output;

namespace FreqReadout.Tests.Commands;

/// <summary>A short simulated capture and the demo scene, made once; every test copies them into a folder of its own.</summary>
public sealed class OutputSafetyInputs : IDisposable
{
    public OutputSafetyInputs()
    {
        Dir = Directory.CreateTempSubdirectory("freqreadout-safety-inputs").FullName;
        var (exit, _, stderr) = ConsoleCapture.Run("simulate", "--demo", "--duration-s", "3", "--out", Path.Combine(Dir, "cap.csv"), "--truth", Path.Combine(Dir, "cap.truth.json"), "--save-scene", Path.Combine(Dir, "scene.json"), "--quiet");
        Assert.True(exit == 0, stderr);
        File.Delete(Path.Combine(Dir, "cap.truth.json"));
    }

    public string Dir { get; }

    public void Dispose() => Directory.Delete(Dir, true);
}

/// <summary>
/// Every command that writes files, run against a full device (/dev/full), an out-of-space error injected
/// into the output stream, a missing folder, and an output that is one of its inputs or another of its
/// outputs (same path, symbolic link, hard link): the exit code and the one error line each gets, and every
/// file that was there before is byte-for-byte unchanged (SHA-256 of the whole folder before and after), with
/// no temporary file left. CI runs as root, so nothing here relies on permissions.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class OutputSafetyTests : IClassFixture<OutputSafetyInputs>, IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-safety").FullName;

    public OutputSafetyTests(OutputSafetyInputs inputs)
    {
        File.Copy(Path.Combine(inputs.Dir, "cap.csv"), Path.Combine(_dir, "cap.csv"));
        File.Copy(Path.Combine(inputs.Dir, "scene.json"), Path.Combine(_dir, "scene.json"));
    }

    public void Dispose() => Directory.Delete(_dir, true);

    /// <summary>One output option of a command: its label in messages, what it holds, the file name used when it is not the one under test.</summary>
    private sealed record Slot(string Label, string What, string FileName);

    /// <summary>A command that writes files: its inputs (by file name in the folder) and its outputs.</summary>
    private sealed record Case(string Name, string[] Inputs, Slot[] Slots, Func<Func<string, string>, string[]> Args);

    private static readonly Case[] Cases =
    {
        new("replay --readings", new[] { "cap.csv" }, new[] { new Slot("--readings", "the readings", "readings.csv") },
            p => new[] { "replay", p("cap.csv"), "--readings", p("--readings"), "--json" }),
        new("replay --readings --events", new[] { "cap.csv" },
            new[] { new Slot("--readings", "the readings", "readings.csv"), new Slot("--events", "the events", "events.csv") },
            p => new[] { "replay", p("cap.csv"), "--readings", p("--readings"), "--events", p("--events"), "--json" }),
        new("simulate --demo", Array.Empty<string>(),
            new[] { new Slot("--out", "the capture", "out.csv"), new Slot("--truth", "the truth file", "out.truth.json") },
            p => new[] { "simulate", "--demo", "--duration-s", "1", "--out", p("--out"), "--truth", p("--truth"), "--quiet" }),
        new("simulate --scene --save-scene", new[] { "scene.json" },
            new[] { new Slot("--out", "the capture", "out.frb"), new Slot("--truth", "the truth file", "out.truth.json"), new Slot("--save-scene", "the scene file", "saved.json") },
            p => new[] { "simulate", "--scene", p("scene.json"), "--duration-s", "1", "--format", "binary", "--out", p("--out"), "--truth", p("--truth"), "--save-scene", p("--save-scene"), "--quiet" }),
        new("convert", new[] { "cap.csv" }, new[] { new Slot("<out>", "the capture", "cap.frb") },
            p => new[] { "convert", p("cap.csv"), p("<out>") }),
        new("convert --salvage", new[] { "cap.csv" }, new[] { new Slot("<out>", "the capture", "cap.frb") },
            p => new[] { "convert", p("cap.csv"), p("<out>"), "--salvage" }),
    };

    public static TheoryData<string, string> EverySlot()
    {
        var data = new TheoryData<string, string>();
        foreach (Case c in Cases)
        {
            foreach (Slot s in c.Slots)
            {
                data.Add(c.Name, s.Label);
            }
        }

        return data;
    }

    public static TheoryData<string, string, string> EveryInputSlot()
    {
        var data = new TheoryData<string, string, string>();
        foreach (Case c in Cases.Where(c => c.Inputs.Length > 0))
        {
            foreach (Slot s in c.Slots)
            {
                foreach (string how in new[] { "same path", "symbolic link", "hard link" })
                {
                    data.Add(c.Name, s.Label, how);
                }
            }
        }

        return data;
    }

    public static TheoryData<string, string, string, string> EveryOutputPair()
    {
        var data = new TheoryData<string, string, string, string>();
        foreach (Case c in Cases)
        {
            for (int i = 0; i < c.Slots.Length; i++)
            {
                for (int j = i + 1; j < c.Slots.Length; j++)
                {
                    foreach (string how in new[] { "same path", "symbolic link", "hard link" })
                    {
                        data.Add(c.Name, c.Slots[i].Label, c.Slots[j].Label, how);
                    }
                }
            }
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(EverySlot))]
    public void A_full_device_fails_the_command_and_changes_nothing(string caseName, string label)
    {
        if (!OperatingSystem.IsLinux())
        {
            return; // /dev/full is Linux's
        }

        Case c = Find(caseName);
        Slot slot = c.Slots.Single(s => s.Label == label);
        PreExisting(c); // the other outputs already hold a user's files
        var (exit, stderr) = Run(c, l => l == label ? "/dev/full" : null);
        Assert.Equal(1, exit);
        AssertOneErrorLine(stderr, $"error: /dev/full: cannot write {slot.What}: the disk is full (no space left on the device)");
        Assert.Equal(FileNodeKind.CharacterDevice, FileIdentity.Of("/dev/full").Kind);
        Assert.Equal("character special file", FileLinks.StatKind("/dev/full"));
    }

    [Theory]
    [MemberData(nameof(EverySlot))]
    public void An_injected_out_of_space_error_fails_the_command_and_changes_nothing(string caseName, string label)
    {
        Case c = Find(caseName);
        Slot slot = c.Slots.Single(s => s.Label == label);
        PreExisting(c);
        var hook = new DiskFullHook(afterBytes: 64, onlyLabel: label);
        int exit;
        string stderr;
        using (OutputStreamHooks.Install(hook))
        {
            (exit, stderr) = Run(c, _ => null);
        }

        Assert.Equal(new[] { label }, hook.Failed);
        Assert.Equal(1, exit);
        string path = Path.Combine(_dir, slot.FileName);
        AssertOneErrorLine(stderr, $"error: {path}: cannot write {slot.What}: the disk is full (no space left on the device) ({path} is unchanged)");
    }

    [Theory]
    [MemberData(nameof(EverySlot))]
    public void A_new_output_that_fails_is_not_created(string caseName, string label)
    {
        Case c = Find(caseName);
        Slot slot = c.Slots.Single(s => s.Label == label);
        using (OutputStreamHooks.Install(new DiskFullHook(afterBytes: 64, onlyLabel: label)))
        {
            var (exit, stderr) = Run(c, _ => null);
            Assert.Equal(1, exit);
            string path = Path.Combine(_dir, slot.FileName);
            AssertOneErrorLine(stderr, $"({path} was not created)");
        }
    }

    [Theory]
    [MemberData(nameof(EverySlot))]
    public void A_missing_folder_is_named_before_any_work(string caseName, string label)
    {
        Case c = Find(caseName);
        Slot slot = c.Slots.Single(s => s.Label == label);
        PreExisting(c);
        string path = Path.Combine(_dir, "no-such-folder", slot.FileName);
        var (exit, stderr) = Run(c, l => l == label ? path : null);
        Assert.Equal(1, exit);
        AssertOneErrorLine(stderr, $"error: {path}: cannot write {slot.What}: its folder does not exist");
    }

    [Theory]
    [MemberData(nameof(EveryInputSlot))]
    public void An_output_that_is_an_input_is_refused(string caseName, string label, string how)
    {
        if (how == "hard link" && OperatingSystem.IsWindows())
        {
            return;
        }

        Case c = Find(caseName);
        PreExisting(c);
        string input = Path.Combine(_dir, c.Inputs[0]);
        string path = how switch
        {
            "same path" => input,
            "symbolic link" => Path.Combine(_dir, "link-" + c.Inputs[0]),
            _ => Path.Combine(_dir, "hard-" + c.Inputs[0]),
        };
        if (how == "symbolic link")
        {
            File.CreateSymbolicLink(path, input);
        }
        else if (how == "hard link")
        {
            FileLinks.Hard(input, path);
        }

        var (exit, stderr) = Run(c, l => l == label ? path : null);
        Assert.Equal(2, exit);
        AssertOneErrorLine(stderr, $"error: {label} {path} is ");
        Assert.Contains($" {input}", stderr);
        Assert.Contains("a command never writes over its own input", stderr);
    }

    [Theory]
    [MemberData(nameof(EveryOutputPair))]
    public void Two_outputs_that_are_one_file_are_refused(string caseName, string first, string second, string how)
    {
        if (how == "hard link" && OperatingSystem.IsWindows())
        {
            return;
        }

        Case c = Find(caseName);
        PreExisting(c);
        string firstPath = Path.Combine(_dir, c.Slots.Single(s => s.Label == first).FileName);
        string secondPath = how switch
        {
            "same path" => firstPath,
            "symbolic link" => Path.Combine(_dir, "link-out"),
            _ => Path.Combine(_dir, "hard-out"),
        };
        if (how == "symbolic link")
        {
            File.CreateSymbolicLink(secondPath, firstPath);
        }
        else if (how == "hard link")
        {
            FileLinks.Hard(firstPath, secondPath);
        }

        var (exit, stderr) = Run(c, l => l == second ? secondPath : null);
        Assert.Equal(2, exit);
        AssertOneErrorLine(stderr, "are the same file");
        Assert.Contains($"{first} {firstPath}", stderr);
        Assert.Contains($"{second} {secondPath}", stderr);
        Assert.Contains("each output needs a file of its own", stderr);
    }

    [Fact]
    public void The_issues_examples_are_refused_and_change_nothing()
    {
        string cap = Path.Combine(_dir, "cap.csv");
        string scene = Path.Combine(_dir, "scene.json");
        string z = Path.Combine(_dir, "z.csv");
        File.WriteAllText(z, "a user's file\n");
        foreach (string[] args in new[]
        {
            new[] { "replay", cap, "--readings", cap },
            new[] { "replay", cap, "--readings", z, "--events", z },
            new[] { "simulate", "--demo", "--out", z, "--truth", z },
            new[] { "simulate", "--scene", scene, "--out", scene },
            new[] { "simulate", "--demo", "--save-scene", z, "--out", z },
        })
        {
            var before = FileSnapshot.Of(_dir);
            var (exit, _, stderr) = ConsoleCapture.RunMain(args);
            Assert.True(exit == 2, string.Join(' ', args) + ": " + stderr);
            AssertOneErrorLine(stderr, "error: ");
            FileSnapshot.AssertUnchanged(before, _dir, string.Join(' ', args));
        }
    }

    [Fact]
    public void A_scene_error_leaves_an_existing_capture_as_it_was()
    {
        string bad = Path.Combine(_dir, "bad.json");
        File.WriteAllText(bad, "{ \"coil\": { \"turns\": 0 } }");
        string old = Path.Combine(_dir, "old.csv");
        File.WriteAllText(old, "a capture worth keeping\n");
        var before = FileSnapshot.Of(_dir);
        var (exit, _, stderr) = ConsoleCapture.RunMain("simulate", "--scene", bad, "--out", old);
        Assert.Equal(1, exit); // a bad scene file is a data problem (docs/exit-codes.md)
        AssertOneErrorLine(stderr, "coil.turns");
        FileSnapshot.AssertUnchanged(before, _dir, "scene error");
    }

    [Fact]
    public void Convert_of_a_damaged_capture_leaves_an_existing_output_as_it_was()
    {
        string damaged = Path.Combine(_dir, "damaged.csv");
        string[] lines = File.ReadAllLines(Path.Combine(_dir, "cap.csv"));
        lines[40] = "not a tick";
        File.WriteAllLines(damaged, lines);
        string output = Path.Combine(_dir, "out.frb");
        File.WriteAllText(output, "an older conversion\n");
        var before = FileSnapshot.Of(_dir);
        var (exit, _, stderr) = ConsoleCapture.RunMain("convert", damaged, output);
        Assert.Equal(1, exit);
        AssertOneErrorLine(stderr, $"damaged.csv:41: ");
        Assert.Contains($"(nothing written: {output} is unchanged; convert --salvage keeps the rows before the damage)", stderr);
        FileSnapshot.AssertUnchanged(before, _dir, "damaged input");
    }

    [Fact]
    public void Demo_keep_refuses_a_device_and_a_truth_that_is_its_capture_and_survives_a_full_disk()
    {
        string keep = Path.Combine(_dir, "kept");
        Directory.CreateDirectory(keep);
        File.WriteAllText(Path.Combine(keep, "floor-demo.csv"), "an older demo capture\n");
        File.CreateSymbolicLink(Path.Combine(keep, "floor-demo.truth.json"), Path.Combine(keep, "floor-demo.csv"));
        var before = FileSnapshot.Of(_dir);
        var (exit, _, stderr) = ConsoleCapture.RunMain("demo", "--keep", keep, "--json");
        Assert.Equal(2, exit);
        AssertOneErrorLine(stderr, "are the same file");
        FileSnapshot.AssertUnchanged(before, _dir, "demo, truth linked to capture");

        File.Delete(Path.Combine(keep, "floor-demo.truth.json"));
        if (OperatingSystem.IsLinux())
        {
            File.CreateSymbolicLink(Path.Combine(keep, "floor-demo.truth.json"), "/dev/full");
            before = FileSnapshot.Of(_dir);
            (exit, _, stderr) = ConsoleCapture.RunMain("demo", "--keep", keep, "--json");
            Assert.Equal(1, exit);
            AssertOneErrorLine(stderr, $"error: {Path.Combine(keep, "floor-demo.truth.json")}: cannot write the demo truth file: the disk is full (no space left on the device)");
            FileSnapshot.AssertUnchanged(before, _dir, "demo, truth on /dev/full");
            Assert.Equal("character special file", FileLinks.StatKind("/dev/full"));
            File.Delete(Path.Combine(keep, "floor-demo.truth.json"));
        }

        File.WriteAllText(Path.Combine(keep, "floor-demo.truth.json"), "an older truth\n");
        before = FileSnapshot.Of(_dir);
        using (OutputStreamHooks.Install(new DiskFullHook(afterBytes: 4096)))
        {
            (exit, _, stderr) = ConsoleCapture.RunMain("demo", "--keep", keep, "--json");
        }

        Assert.Equal(1, exit);
        AssertOneErrorLine(stderr, "the disk is full (no space left on the device)");
        FileSnapshot.AssertUnchanged(before, _dir, "demo, disk full");
    }

    [Fact]
    public void Convert_to_dev_stdout_writes_through_the_descriptor()
    {
        if (!OperatingSystem.IsLinux())
        {
            return;
        }

        // Standard output is a pipe here; through a shell's ">>" the same descriptor would append, not replace.
        var before = FileSnapshot.Of(_dir);
        Docs.CliProcess.Result r = Docs.CliProcess.Run(_dir, new[] { "convert", "cap.csv", "/dev/stdout", "--to", "text" });
        Assert.True(r.ExitCode == 0, r.Stderr);
        Assert.Equal(File.ReadAllText(Path.Combine(_dir, "cap.csv")), r.Stdout);
        Assert.Contains("standard output: text capture", r.Stderr);
        FileSnapshot.AssertUnchanged(before, _dir, "convert to /dev/stdout");
    }

    private static Case Find(string name) => Cases.Single(c => c.Name == name);

    /// <summary>Gives every output of the case a file that already exists, so that "unchanged" is a real check.</summary>
    private void PreExisting(Case c)
    {
        foreach (Slot s in c.Slots)
        {
            File.WriteAllText(Path.Combine(_dir, s.FileName), $"a user's {s.What}, made before the test\n");
        }
    }

    /// <summary>Runs the case with each output at its usual file unless <paramref name="pathFor"/> gives another; checks the folder is unchanged.</summary>
    private (int Exit, string Stderr) Run(Case c, Func<string, string?> pathFor)
    {
        var before = FileSnapshot.Of(_dir);
        string P(string key)
        {
            Slot? slot = c.Slots.FirstOrDefault(s => s.Label == key);
            return slot == null ? Path.Combine(_dir, key) : pathFor(key) ?? Path.Combine(_dir, slot.FileName);
        }

        string[] args = c.Args(P);
        var (exit, _, stderr) = ConsoleCapture.RunMain(args);
        FileSnapshot.AssertUnchanged(before, _dir, c.Name + ": " + string.Join(' ', args));
        return (exit, stderr);
    }

    private static void AssertOneErrorLine(string stderr, string expectedPart)
    {
        string[] lines = stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.True(lines.Count(l => l.StartsWith("error: ", StringComparison.Ordinal)) == 1, $"expected one error line, got:\n{stderr}");
        Assert.Contains(expectedPart, stderr);
        Assert.DoesNotContain("   at ", stderr);
    }
}
