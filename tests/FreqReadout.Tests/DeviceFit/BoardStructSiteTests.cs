namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// The board adapters follow the device rule on structs too (nanoCLR puts every struct local and every struct it
/// creates on the heap): outside constructors the only struct sites allowed are the ones a nanoFramework API forces,
/// each listed here with the reason and explained by a comment in the source ("the API forces"). A new site fails
/// this test until it is avoided or, when an API forces it, listed and commented.
/// </summary>
public class BoardStructSiteTests
{
    /// <summary>Method (as DeviceModule names it) and site, with the API that forces it.</summary>
    private static readonly Dictionary<string, string> ForcedByApi = new()
    {
        ["PulseCounterPort.TryReadSnapshot: local of type GpioPulseCount"] = "GpioPulseCounter.Read() returns the struct GpioPulseCount",
        ["I2cCharacterLcd.Send: local of type I2cTransferResult"] = "I2cDevice.Write returns the struct I2cTransferResult",
        ["I2cCharacterLcd.Send: newobj SpanByte"] = "I2cDevice.Write takes the struct SpanByte",
        ["Tmp102Sensor.TryReadCelsius: local of type I2cTransferResult"] = "I2cDevice.WriteRead returns the struct I2cTransferResult (once a second)",
        ["Tmp102Sensor.TryReadCelsius: newobj SpanByte"] = "I2cDevice.WriteRead takes two structs SpanByte (once a second)",
    };

    [Fact]
    public void Board_code_holds_and_creates_structs_only_where_a_nanoFramework_API_forces_it()
    {
        string board = BoardAssemblyPaths.Board();
        string mscorlib = NanoMscorlib.FindPath(DeviceAssemblyMetadataTests.FindDeviceAssembly());
        using DeviceModule module = DeviceModule.OpenWithReferences(board, mscorlib, [BoardAssemblyPaths.Shim(), DeviceAssemblyMetadataTests.FindDeviceAssembly()]);
        Assert.True(module.Methods().Count() > 20, "board assembly looks empty: " + board);

        string[] found = StructSiteChecker.Find(module).Select(s => s.ToString()).OrderBy(s => s, StringComparer.Ordinal).ToArray();
        string[] unexpected = found.Where(s => !ForcedByApi.ContainsKey(s)).ToArray();
        string[] gone = ForcedByApi.Keys.Where(k => !found.Contains(k)).ToArray();
        Assert.True(unexpected.Length == 0, "struct sites in firmware/Board that no nanoFramework API forces (avoid them, or list and comment them):\n" + string.Join("\n", unexpected));
        Assert.True(gone.Length == 0, "listed struct sites no longer found (remove them from the list):\n" + string.Join("\n", gone));
    }

    [Fact]
    public void Each_forced_site_is_explained_in_the_source()
    {
        string root = Path.Combine(BoardAssemblyPaths.RepositoryRoot(), "firmware", "Board");
        foreach (string site in ForcedByApi.Keys)
        {
            string type = site.Substring(0, site.IndexOf('.'));
            string source = File.ReadAllText(Path.Combine(root, type + ".cs"));
            Assert.True(source.Contains("the API forces", StringComparison.Ordinal), type + ".cs holds a struct site (" + site + ") without a comment saying the API forces it");
        }
    }
}
