namespace FreqReadout.Tests.DeviceFit;

/// <summary>Where the repository and the compiled board and shim assemblies are (built by this test project's references, same configuration).</summary>
internal static class BoardAssemblyPaths
{
    public const string ShimAssemblyName = "FreqReadout.BoardShim.CompileOnly";

    public static string RepositoryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir != null && !File.Exists(Path.Combine(dir.FullName, "FreqReadout.sln")))
        {
            dir = dir.Parent;
        }

        Assert.True(dir != null, "FreqReadout.sln not found above " + AppContext.BaseDirectory);
        return dir!.FullName;
    }

    /// <summary>firmware/Board's assembly (the adapters compiled against the shim).</summary>
    public static string Board() => Built(Path.Combine("firmware", "Board"), "FreqReadout.Firmware.Board.dll");

    /// <summary>firmware/BoardShim's assembly.</summary>
    public static string Shim() => Built(Path.Combine("firmware", "BoardShim"), ShimAssemblyName + ".dll");

    /// <summary>The board adapters' sources, joined (for the enum values the compiler inlines).</summary>
    public static string BoardSources()
    {
        string dir = Path.Combine(RepositoryRoot(), "firmware", "Board");
        return string.Join("\n", Directory.EnumerateFiles(dir, "*.cs", SearchOption.AllDirectories)
            .Where(f => !IsBuildOutput(dir, f))
            .Select(File.ReadAllText));
    }

    public static bool IsBuildOutput(string projectDir, string file)
    {
        string relative = Path.GetRelativePath(projectDir, file).Replace('\\', '/');
        return relative.StartsWith("bin/", StringComparison.Ordinal) || relative.StartsWith("obj/", StringComparison.Ordinal);
    }

    private static string Built(string projectDir, string file)
    {
        string configuration = new DirectoryInfo(AppContext.BaseDirectory).Parent!.Name; // .../bin/<Configuration>/net10.0/
        string path = Path.Combine(RepositoryRoot(), projectDir, "bin", configuration, "netstandard2.0", file);
        Assert.True(File.Exists(path), "not built: " + path + " (dotnet build tests/FreqReadout.Tests builds it)");
        return path;
    }
}
