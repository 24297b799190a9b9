using System.Reflection.Metadata;
using System.Reflection.PortableExecutable;
using System.Xml.Linq;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// The deployable project (firmware/FreqReadout.Firmware.nfproj with firmware/packages.config) must compile exactly
/// what CI compiles (the portable firmware assembly and the board assembly, read from their PDBs) and reference the
/// real nanoFramework packages at the pinned versions below, each pin's nuspec dependencies satisfied by the other
/// pins. hardware-notes/build-and-flash.md, "Package pins", gives the same evidence in prose.
/// </summary>
public class DeployProjectTests
{
    private static readonly XNamespace MsBuild = "http://schemas.microsoft.com/developer/msbuild/2003";

    /// <summary>
    /// Each version is the one whose nuspec, in nanoFramework's own repository at the release tag, depends on
    /// nanoFramework.CoreLibrary 1.17.11 exactly; the dependencies are that nuspec's, read with git show.
    /// </summary>
    internal static readonly PackagePin[] Pins =
    [
        new("nanoFramework.CoreLibrary", "1.17.11", "mscorlib",
            "the package itself (served here; its mscorlib.pe carries native checksum 0x1549C856, the one nanoframework/nf-interpreter declares from 5269a2361, 2025-04-02)", []),
        new("nanoFramework.Runtime.Events", "1.11.32", "nanoFramework.Runtime.Events",
            "nanoframework/nanoFramework.Runtime.Events, nanoFramework.Runtime.Events.nuspec, tag v1.11.32 (3becfe40f827cea4e80e4710346541c93bd4dfc8)",
            ["nanoFramework.CoreLibrary 1.17.11"]),
        new("nanoFramework.System.Device.Gpio", "1.1.57", "System.Device.Gpio",
            "nanoframework/System.Device.Gpio, nanoFramework.System.Device.Gpio.nuspec, tag v1.1.57 (8b832b8512adcf2b8d5802095402d3bd11fb8b10)",
            ["nanoFramework.CoreLibrary 1.17.11", "nanoFramework.Runtime.Events 1.11.32"]),
        new("nanoFramework.Hardware.Esp32", "1.6.34", "nanoFramework.Hardware.Esp32",
            "nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32.nuspec, tag v1.6.34 (1c9a241fd73b9e654012ebee524e63b9442a36a8)",
            ["nanoFramework.CoreLibrary 1.17.11", "nanoFramework.Runtime.Events 1.11.32"]),
        new("nanoFramework.System.Text", "1.3.42", "nanoFramework.System.Text",
            "nanoframework/System.Text, nanoFramework.System.Text.nuspec, tag v1.3.42 (a231e6e090940b21dc8a1593ffc09179f08ff1b0)",
            ["nanoFramework.CoreLibrary 1.17.11"]),
        new("nanoFramework.System.IO.Streams", "1.1.94", "System.IO.Streams",
            "nanoframework/System.IO.Streams, nanoFramework.System.IO.Streams.nuspec, tag v1.1.94 (04ea7bed5951c34387ce44cf70a7cae57fb7c2f4)",
            ["nanoFramework.CoreLibrary 1.17.11", "nanoFramework.System.Text 1.3.42"]),
        new("nanoFramework.System.IO.Ports", "1.1.131", "System.IO.Ports",
            "nanoframework/System.IO.Ports, nanoFramework.System.IO.Ports.nuspec, tag v1.1.131 (a2dc3fd1de9717f33e78633236ba7c69cec4d4cb)",
            ["nanoFramework.CoreLibrary 1.17.11", "nanoFramework.Runtime.Events 1.11.32", "nanoFramework.System.IO.Streams 1.1.94"]),
        new("nanoFramework.System.Device.I2c", "1.1.29", "System.Device.I2c",
            "nanoframework/System.Device.I2c, nanoFramework.System.Device.I2c.nuspec, tag v1.1.29 (ac5858c8be7d7b917854328ebc023c8bf66dbfee)",
            ["nanoFramework.CoreLibrary 1.17.11"]),
        new("nanoFramework.System.Device.Pwm", "1.1.23", "System.Device.Pwm",
            "nanoframework/System.Device.Pwm, nanoFramework.System.Device.Pwm.nuspec, tag v1.1.23 (8f14504caeb537dd541fe0f2c8eeb77979cd3654)",
            ["nanoFramework.CoreLibrary 1.17.11"]),
        new("nanoFramework.System.IO.FileSystem", "1.1.85", "System.IO.FileSystem",
            "nanoframework/System.IO.FileSystem, nanoFramework.System.IO.FileSystem.nuspec, tag v1.1.85 (c08267d758a6cb422cac47f811612bde3880be73)",
            ["nanoFramework.CoreLibrary 1.17.11", "nanoFramework.Runtime.Events 1.11.32", "nanoFramework.System.IO.Streams 1.1.94", "nanoFramework.System.Text 1.3.42"]),
    ];

    private static string FirmwareDir => Path.Combine(BoardAssemblyPaths.RepositoryRoot(), "firmware");

    [Fact]
    public void Deployable_project_compiles_exactly_the_sources_CI_compiles()
    {
        XDocument project = XDocument.Load(Path.Combine(FirmwareDir, "FreqReadout.Firmware.nfproj"));
        var deployed = new SortedSet<string>(StringComparer.Ordinal);
        foreach (XElement compile in project.Descendants(MsBuild + "Compile"))
        {
            deployed.UnionWith(MsBuildGlob.Expand(FirmwareDir, (string)compile.Attribute("Include")!, (string?)compile.Attribute("Exclude")));
        }

        var ci = new SortedSet<string>(StringComparer.Ordinal);
        ci.UnionWith(CompiledSources(Path.ChangeExtension(DeviceAssemblyMetadataTests.FindDeviceAssembly(), ".pdb")));
        ci.UnionWith(CompiledSources(Path.ChangeExtension(BoardAssemblyPaths.Board(), ".pdb")));

        Assert.True(ci.Count > 50, "CI compiles suspiciously few sources: " + ci.Count);
        Assert.Contains(ci, f => f.EndsWith(Path.Combine("Board", "Program.cs"), StringComparison.Ordinal));
        string[] onlyDeployed = deployed.Except(ci).ToArray();
        string[] onlyCi = ci.Except(deployed).ToArray();
        Assert.True(onlyDeployed.Length == 0 && onlyCi.Length == 0,
            "firmware/FreqReadout.Firmware.nfproj and the CI projects (firmware/FreqReadout.Firmware.csproj + firmware/Board) compile different files.\n"
            + "only in the .nfproj:\n  " + string.Join("\n  ", onlyDeployed) + "\nonly in CI:\n  " + string.Join("\n  ", onlyCi));
        Assert.DoesNotContain(deployed, f => f.Contains(Path.DirectorySeparatorChar + "BoardShim" + Path.DirectorySeparatorChar, StringComparison.Ordinal));
    }

    [Fact]
    public void Packages_config_holds_exactly_the_pinned_versions()
    {
        XDocument config = XDocument.Load(Path.Combine(FirmwareDir, "packages.config"));
        string[] listed = config.Root!.Elements("package")
            .Select(p => (string)p.Attribute("id")! + " " + (string)p.Attribute("version")!)
            .OrderBy(s => s, StringComparer.Ordinal).ToArray();
        string[] pinned = Pins.Select(p => p.Id + " " + p.Version).OrderBy(s => s, StringComparer.Ordinal).ToArray();
        Assert.Equal(pinned, listed);
        Assert.All(config.Root.Elements("package"), p => Assert.Equal("netnano1.0", (string?)p.Attribute("targetFramework")));
    }

    [Fact]
    public void Every_pins_nuspec_dependencies_are_pinned_at_exactly_that_version()
    {
        var versions = Pins.ToDictionary(p => p.Id, p => p.Version);
        foreach (PackagePin pin in Pins)
        {
            foreach (string dependency in pin.Dependencies)
            {
                string[] parts = dependency.Split(' ');
                Assert.True(versions.TryGetValue(parts[0], out string? pinned), pin.Id + " " + pin.Version + " depends on " + parts[0] + ", which is not pinned (" + pin.Source + ")");
                Assert.True(pinned == parts[1], pin.Id + " " + pin.Version + " depends on " + dependency + " but " + parts[0] + " is pinned at " + pinned + " (" + pin.Source + ")");
            }
        }
    }

    [Fact]
    public void Deployable_project_references_each_pinned_assembly_from_its_package_folder()
    {
        XDocument project = XDocument.Load(Path.Combine(FirmwareDir, "FreqReadout.Firmware.nfproj"));
        var hintPaths = project.Descendants(MsBuild + "Reference")
            .ToDictionary(r => (string)r.Attribute("Include")!, r => (string?)r.Element(MsBuild + "HintPath"));
        Assert.Equal(Pins.Select(p => p.Assembly).OrderBy(s => s, StringComparer.Ordinal), hintPaths.Keys.OrderBy(s => s, StringComparer.Ordinal));
        foreach (PackagePin pin in Pins)
        {
            Assert.Equal(@"packages\" + pin.Id + "." + pin.Version + @"\lib\" + pin.Assembly + ".dll", hintPaths[pin.Assembly]);
        }

        Assert.DoesNotContain(BoardAssemblyPaths.ShimAssemblyName, File.ReadAllText(Path.Combine(FirmwareDir, "FreqReadout.Firmware.nfproj")), StringComparison.Ordinal);
    }

    [Fact]
    public void CI_compiles_against_the_same_CoreLibrary_the_board_runs()
    {
        string pinned = Pins.Single(p => p.Id == "nanoFramework.CoreLibrary").Version;
        Assert.Equal(NanoMscorlib.PackageVersion, pinned);
        foreach (string csproj in new[] { "FreqReadout.Firmware.csproj", Path.Combine("Board", "FreqReadout.Firmware.Board.csproj"), Path.Combine("BoardShim", "FreqReadout.BoardShim.csproj") })
        {
            XDocument project = XDocument.Load(Path.Combine(FirmwareDir, csproj));
            XElement reference = project.Descendants("PackageReference").Single(r => (string?)r.Attribute("Include") == "nanoFramework.CoreLibrary");
            Assert.True((string?)reference.Attribute("Version") == pinned, csproj + " compiles against nanoFramework.CoreLibrary " + (string?)reference.Attribute("Version") + ", the board runs " + pinned);
        }
    }

    private static IEnumerable<string> CompiledSources(string pdbPath)
    {
        Assert.True(File.Exists(pdbPath), "no PDB beside the assembly: " + pdbPath);
        using var provider = MetadataReaderProvider.FromPortablePdbStream(File.OpenRead(pdbPath));
        MetadataReader pdb = provider.GetMetadataReader();
        var files = new List<string>();
        foreach (DocumentHandle h in pdb.Documents)
        {
            string name = pdb.GetString(pdb.GetDocument(h).Name);
            Assert.True(Path.IsPathFullyQualified(name) && !name.StartsWith("/_", StringComparison.Ordinal),
                pdbPath + " names a mapped source path (" + name + "): build without ContinuousIntegrationBuild/PathMap to compare files");
            string full = Path.GetFullPath(name);
            if (full.Split(Path.DirectorySeparatorChar).Contains("obj"))
            {
                continue; // generated by the SDK (target framework attribute), not a source
            }

            files.Add(full);
        }

        return files;
    }
}
