using System.Text;
using FreqReadout.Host.Output;

namespace FreqReadout.Tests.Output;

/// <summary>
/// The output layer on its own: a regular file is replaced only on commit (through a temporary file
/// beside it, links followed, permission bits kept), devices and pipes are written directly, an
/// output that is an input or another output is refused by file identity, and a recording writes
/// in place and keeps its partial file.
/// </summary>
public sealed class OutputFileSetTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("freqreadout-output").FullName;

    public void Dispose() => Directory.Delete(_dir, true);

    private string P(string name) => Path.Combine(_dir, name);

    private static void Write(OutputFile file, string text)
    {
        using var w = new StreamWriter(file.Stream, new UTF8Encoding(false));
        w.Write(text);
    }

    private static OutputFileException Refused(OutputFileSet set)
    {
        Assert.False(set.TryPrepare(out OutputFileException? problem));
        return problem!;
    }

    [Fact]
    public void An_existing_file_is_replaced_only_on_commit()
    {
        File.WriteAllText(P("out.csv"), "old");
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--out", P("out.csv"), "the capture");
            Assert.True(set.TryPrepare(out _));
            Assert.Equal(OutputTargetKind.ExistingFile, o.TargetKind);
            Write(o, "new and longer");
            Assert.Equal("old", File.ReadAllText(P("out.csv"))); // written beside it, not into it
            Assert.NotEqual(P("out.csv"), o.ContentPath);
            Assert.Equal("new and longer", File.ReadAllText(o.ContentPath!));
        }

        // Disposed without a commit: the old bytes, and no temporary file left.
        Assert.Equal("old", File.ReadAllText(P("out.csv")));
        Assert.Equal(new[] { "out.csv" }, Directory.GetFileSystemEntries(_dir).Select(Path.GetFileName));

        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--out", P("out.csv"), "the capture");
            Assert.True(set.TryPrepare(out _));
            Write(o, "new");
            set.Commit();
            Assert.True(o.Committed);
        }

        Assert.Equal("new", File.ReadAllText(P("out.csv")));
        Assert.Equal(new[] { "out.csv" }, Directory.GetFileSystemEntries(_dir).Select(Path.GetFileName));
    }

    [Fact]
    public void A_new_file_appears_only_on_commit()
    {
        using var set = new OutputFileSet();
        OutputFile o = set.AddOutput("--out", P("new.csv"), "the capture");
        Assert.True(set.TryPrepare(out _));
        Assert.Equal(OutputTargetKind.NewFile, o.TargetKind);
        Assert.Equal($"{P("new.csv")} was not created", o.UnchangedNote);
        Write(o, "rows");
        Assert.False(File.Exists(P("new.csv")));
        set.Commit();
        Assert.Equal("rows", File.ReadAllText(P("new.csv")));
    }

    [Fact]
    public void The_permission_bits_of_a_replaced_file_are_kept()
    {
        if (OperatingSystem.IsWindows())
        {
            return; // no Unix mode bits
        }

        File.WriteAllText(P("out.csv"), "old");
        var mode = UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.GroupRead;
        File.SetUnixFileMode(P("out.csv"), mode);
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--out", P("out.csv"), "the capture");
            Assert.True(set.TryPrepare(out _));
            Write(o, "new");
            set.Commit();
        }

        Assert.Equal(mode, File.GetUnixFileMode(P("out.csv")));
    }

    [Fact]
    public void A_symbolic_link_is_followed_and_stays_a_link()
    {
        File.WriteAllText(P("target.csv"), "old");
        File.CreateSymbolicLink(P("link.csv"), "target.csv");
        File.CreateSymbolicLink(P("dangling.csv"), "later.csv");
        using (var set = new OutputFileSet())
        {
            OutputFile a = set.AddOutput("--a", P("link.csv"), "a");
            OutputFile b = set.AddOutput("--b", P("dangling.csv"), "b");
            Assert.True(set.TryPrepare(out _));
            Assert.Equal(P("target.csv"), a.TargetPath);
            Assert.Equal(OutputTargetKind.NewFile, b.TargetKind);
            Write(a, "new");
            Write(b, "made");
            set.Commit();
        }

        Assert.Equal("target.csv", new FileInfo(P("link.csv")).LinkTarget);
        Assert.Equal("new", File.ReadAllText(P("target.csv")));
        Assert.Equal("later.csv", new FileInfo(P("dangling.csv")).LinkTarget);
        Assert.Equal("made", File.ReadAllText(P("later.csv")));
    }

    [Theory]
    [InlineData("same path")]
    [InlineData("another spelling")]
    [InlineData("symbolic link")]
    [InlineData("hard link")]
    public void An_output_that_is_an_input_is_refused(string how)
    {
        File.WriteAllText(P("in.csv"), "capture");
        string output = how switch
        {
            "same path" => P("in.csv"),
            "another spelling" => Path.Combine(_dir, "sub", "..", "in.csv"),
            "symbolic link" => P("link.csv"),
            _ => P("hard.csv"),
        };
        Directory.CreateDirectory(P("sub"));
        if (how == "symbolic link")
        {
            File.CreateSymbolicLink(output, P("in.csv"));
        }
        else if (how == "hard link")
        {
            if (OperatingSystem.IsWindows())
            {
                return;
            }

            FileLinks.Hard(P("in.csv"), output);
        }

        var before = FileSnapshot.Of(_dir);
        using var set = new OutputFileSet();
        set.AddInput("the capture", P("in.csv"));
        set.AddOutput("--readings", output, "the readings");
        OutputFileException e = Refused(set);
        Assert.Equal(OutputFileException.UsageExitCode, e.ExitCode);
        Assert.StartsWith($"--readings {output} is the capture {P("in.csv")}", e.Message);
        Assert.Contains("never writes over its own input", e.Message);
        Assert.Equal(how is "same path" or "another spelling", !e.Message.Contains("another name or through a link"));
        FileSnapshot.AssertUnchanged(before, _dir, how);
    }

    [Theory]
    [InlineData("same path", false)]
    [InlineData("same path", true)]
    [InlineData("symbolic link", true)]
    [InlineData("linked folder", false)]
    [InlineData("hard link", true)]
    public void Two_outputs_that_are_one_file_are_refused(string how, bool exists)
    {
        Directory.CreateDirectory(P("real"));
        Directory.CreateSymbolicLink(P("alias"), P("real"));
        string first = P("real/out.csv");
        if (exists)
        {
            File.WriteAllText(first, "old");
        }

        string second = how switch
        {
            "same path" => first,
            "symbolic link" => P("link.csv"),
            "linked folder" => P("alias/out.csv"),
            _ => P("hard.csv"),
        };
        if (how == "symbolic link")
        {
            File.CreateSymbolicLink(second, first);
        }
        else if (how == "hard link")
        {
            if (OperatingSystem.IsWindows())
            {
                return;
            }

            FileLinks.Hard(first, second);
        }

        var before = FileSnapshot.Of(_dir);
        using var set = new OutputFileSet();
        set.AddOutput("--readings", first, "the readings");
        set.AddOutput("--events", second, "the events");
        OutputFileException e = Refused(set);
        Assert.Equal(OutputFileException.UsageExitCode, e.ExitCode);
        Assert.StartsWith($"--readings {first} and --events {second} are the same file", e.Message);
        FileSnapshot.AssertUnchanged(before, _dir, how);
    }

    [Fact]
    public void Different_files_in_one_folder_are_accepted()
    {
        using var set = new OutputFileSet();
        set.AddInput("the capture", P("in.csv"));
        set.AddOutput("--readings", P("readings.csv"), "the readings");
        set.AddOutput("--events", P("events.csv"), "the events");
        Assert.True(set.TryPrepare(out _));
    }

    [Fact]
    public void A_missing_folder_a_folder_and_an_empty_path_are_named_before_anything_is_created()
    {
        File.WriteAllText(P("keep.csv"), "x");
        var before = FileSnapshot.Of(_dir);
        foreach ((string path, string expected, int exit) in new[]
        {
            (P("no/such/out.csv"), P("no/such/out.csv") + ": cannot write the readings: its folder does not exist", 1),
            (_dir, _dir + ": cannot write the readings: is a directory, expected a file", 1),
            (P("keep.csv/out.csv"), P("keep.csv/out.csv") + $": cannot write the readings: {P("keep.csv")} is not a folder", 1),
            (string.Empty, "--readings: the path is empty; give a file name", 2),
        })
        {
            using var set = new OutputFileSet();
            set.AddOutput("--events", P("events.csv"), "the events"); // fine on its own: must not be left behind
            set.AddOutput("--readings", path, "the readings");
            OutputFileException e = Refused(set);
            Assert.Equal(expected, e.Message);
            Assert.Equal(exit, e.ExitCode);
            FileSnapshot.AssertUnchanged(before, _dir, path);
        }
    }

    [Fact]
    public void A_disk_that_fills_up_names_the_users_path_and_leaves_the_file_as_it_was()
    {
        File.WriteAllText(P("out.csv"), "old");
        var before = FileSnapshot.Of(_dir);
        var hook = new DiskFullHook(afterBytes: 10);
        using (OutputStreamHooks.Install(hook))
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--out", P("out.csv"), "the capture");
            Assert.True(set.TryPrepare(out _));
            var e = Assert.Throws<OutputFileException>(() => Write(o, new string('x', 100)));
            Assert.Equal($"{P("out.csv")}: cannot write the capture: the disk is full (no space left on the device) ({P("out.csv")} is unchanged)", e.Message);
            Assert.Equal(OutputFileException.FileExitCode, e.ExitCode);
        }

        Assert.Equal(new[] { "--out" }, hook.Failed);
        FileSnapshot.AssertUnchanged(before, _dir, "disk full");
    }

    [Fact]
    public void Devices_are_written_directly_and_never_removed()
    {
        if (!OperatingSystem.IsLinux())
        {
            return; // /dev/null and /dev/full are Linux's
        }

        using (var set = new OutputFileSet())
        {
            OutputFile a = set.AddOutput("--readings", "/dev/null", "the readings");
            OutputFile b = set.AddOutput("--events", "/dev/null", "the events"); // nothing is replaced: allowed twice
            Assert.True(set.TryPrepare(out _));
            Assert.Equal(OutputTargetKind.Device, a.TargetKind);
            Assert.Null(a.ContentPath);
            Write(a, "rows");
            Write(b, "events");
            set.Commit();
        }

        using (var set = new OutputFileSet())
        {
            OutputFile full = set.AddOutput("<out>", "/dev/full", "the capture");
            Assert.True(set.TryPrepare(out _));
            var e = Assert.ThrowsAny<OutputFileException>(() =>
            {
                Write(full, new string('x', 200_000)); // more than the buffers hold
                set.Commit();
            });
            Assert.Equal("/dev/full: cannot write the capture: the disk is full (no space left on the device)", e.Message);
        }

        Assert.Equal(FileNodeKind.CharacterDevice, FileIdentity.Of("/dev/full").Kind);
        Assert.Equal("character special file", FileLinks.StatKind("/dev/full"));
    }

    [Fact]
    public async Task A_named_pipe_is_written_directly()
    {
        if (!OperatingSystem.IsLinux())
        {
            return;
        }

        FileLinks.Fifo(P("pipe"));
        Task<string> reader = Task.Run(() => File.ReadAllText(P("pipe")));
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--readings", P("pipe"), "the readings");
            Assert.True(set.TryPrepare(out _));
            Assert.Equal(OutputTargetKind.Pipe, o.TargetKind);
            Write(o, "through the pipe");
            set.Commit();
        }

        Assert.Equal("through the pipe", await reader.WaitAsync(TimeSpan.FromSeconds(30)));
        Assert.Equal("fifo", FileLinks.StatKind(P("pipe")));
    }

    [Fact]
    public void A_file_that_must_be_read_back_refuses_a_device_and_standard_output()
    {
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--keep", OperatingSystem.IsWindows() ? "NUL" : "/dev/null", "the demo capture");
            o.RegularFileNeededBecause = "it is read back";
            Assert.EndsWith("cannot write the demo capture: is a device, but a regular file is needed: it is read back", Refused(set).Message);
        }

        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("<out>", "-", "the capture");
            o.RegularFileNeededBecause = "it is read back";
            Assert.Equal("standard output: cannot write the capture: is standard output, but a regular file is needed: it is read back", Refused(set).Message);
        }
    }

    [Fact]
    public void Standard_output_is_refused_when_the_report_goes_there_or_twice()
    {
        using (var set = new OutputFileSet { StandardOutputInUse = true })
        {
            set.AddOutput("--readings", "-", "the readings");
            Assert.Equal("--readings -: standard output already carries this command's report; give a file name", Refused(set).Message);
        }

        using (var set = new OutputFileSet())
        {
            set.AddOutput("--readings", "-", "the readings");
            set.AddOutput("--events", "-", "the events");
            Assert.Equal("--readings - and --events - would both go to standard output: give one of them a file name", Refused(set).Message);
        }

        if (!OperatingSystem.IsWindows())
        {
            // The names of descriptors 1 and 2 are the streams themselves, never files to replace.
            using (var set = new OutputFileSet { StandardOutputInUse = true })
            {
                set.AddOutput("--readings", "/dev/stdout", "the readings");
                Assert.Equal("--readings /dev/stdout: standard output already carries this command's report; give a file name", Refused(set).Message);
            }

            using (var set = new OutputFileSet())
            {
                set.AddOutput("<out>", "/dev/stderr", "the capture");
                Assert.Equal("<out> /dev/stderr: standard error carries this command's messages; give a file name", Refused(set).Message);
            }

            using (var set = new OutputFileSet())
            {
                OutputFile o = set.AddOutput("<out>", "/dev/fd/1", "the capture");
                Assert.True(set.TryPrepare(out _));
                Assert.Equal(OutputTargetKind.StandardOutput, o.TargetKind);
            }
        }
    }

    [Fact]
    public void A_recording_writes_in_place_and_keeps_its_partial_file()
    {
        using (var set = new OutputFileSet())
        {
            OutputFile o = set.AddOutput("--out", P("rec.csv"), "the recording", OutputWriteMode.Recording);
            Assert.True(set.TryPrepare(out _));
            Assert.Equal(P("rec.csv"), o.ContentPath);
            o.Stream.Write(Encoding.ASCII.GetBytes("row 1\nrow 2\nro"));
            o.FlushToDisk();
            Assert.Equal("row 1\nrow 2\nro", File.ReadAllText(P("rec.csv"))); // on disk as it arrives
            o.Stream.Write(Encoding.ASCII.GetBytes("w 3\n"));
            // No commit: the run "fails" (a lost link, an interruption).
        }

        Assert.Equal("row 1\nrow 2\nrow 3\n", File.ReadAllText(P("rec.csv")));
        Assert.Equal(new[] { "rec.csv" }, Directory.GetFileSystemEntries(_dir).Select(Path.GetFileName));

        var before = FileSnapshot.Of(_dir);
        using (var set = new OutputFileSet())
        {
            set.AddOutput("--out", P("rec.csv"), "the recording", OutputWriteMode.Recording);
            Assert.Equal($"{P("rec.csv")}: cannot write the recording: the file exists, and a recording never overwrites one; choose a new file name", Refused(set).Message);
        }

        FileSnapshot.AssertUnchanged(before, _dir, "recording over an existing file");
    }

    [Fact]
    public void File_identity_tells_links_copies_devices_and_missing_files_apart()
    {
        File.WriteAllText(P("a.csv"), "same bytes");
        File.WriteAllText(P("copy.csv"), "same bytes");
        File.CreateSymbolicLink(P("link.csv"), P("a.csv"));
        FileIdentity a = FileIdentity.Of(P("a.csv"));
        Assert.Equal(FileNodeKind.Regular, a.Kind);
        Assert.True(a.SameFileAs(FileIdentity.Of(P("link.csv"))));
        Assert.False(a.SameFileAs(FileIdentity.Of(P("copy.csv"))));
        Assert.Equal(FileNodeKind.Missing, FileIdentity.Of(P("none.csv")).Kind);
        Assert.Equal(FileNodeKind.Missing, FileIdentity.Of(P("none/none.csv")).Kind);
        Assert.Equal(FileNodeKind.Directory, FileIdentity.Of(_dir).Kind);
        if (!OperatingSystem.IsWindows())
        {
            FileLinks.Hard(P("a.csv"), P("hard.csv"));
            Assert.True(a.SameFileAs(FileIdentity.Of(P("hard.csv"))));
            Assert.Equal((int)File.GetUnixFileMode(P("a.csv")), a.PermissionBits);
        }

        if (OperatingSystem.IsLinux())
        {
            Assert.Equal(FileNodeKind.CharacterDevice, FileIdentity.Of("/dev/null").Kind);
        }
    }
}
