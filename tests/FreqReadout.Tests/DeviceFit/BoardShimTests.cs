using System.Reflection.Metadata;
using System.Reflection.Metadata.Ecma335;
using System.Reflection.PortableExecutable;
using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// The compile-only shim of nanoFramework's board APIs (firmware/BoardShim) lets firmware/Board compile here, where the
/// real packages are not served. These tests keep it a declaration of what the board code uses and nothing more: no
/// member the board does not use, no body that does anything but throw, an assembly name no one can take for the
/// real packages, and no board code in the portable device assembly. The snippet tests show the usage check bites.
/// </summary>
public class BoardShimTests
{
    [Fact]
    public void Shim_declares_only_members_the_board_code_uses()
    {
        byte[] shim = File.ReadAllBytes(BoardAssemblyPaths.Shim());
        byte[] board = File.ReadAllBytes(BoardAssemblyPaths.Board());
        IReadOnlyList<string> unused = BoardShimUsage.FindUnused(shim, board, BoardAssemblyPaths.BoardSources());
        Assert.True(unused.Count == 0, "the compile-only shim declares what firmware/Board does not use (remove it from firmware/BoardShim):\n" + string.Join("\n", unused));
    }

    [Fact]
    public void Every_shim_body_only_throws_NotImplementedException()
    {
        IReadOnlyList<string> offenders = BoardShimUsage.FindBodiesThatDoMoreThanThrow(File.ReadAllBytes(BoardAssemblyPaths.Shim()));
        Assert.True(offenders.Count == 0, "shim bodies that do more than throw NotImplementedException:\n" + string.Join("\n", offenders));
    }

    [Fact]
    public void Shim_has_its_own_assembly_name_and_the_board_references_it_mscorlib_and_the_firmware_only()
    {
        using (var pe = new PEReader(File.OpenRead(BoardAssemblyPaths.Shim())))
        {
            MetadataReader md = pe.GetMetadataReader();
            Assert.Equal(BoardAssemblyPaths.ShimAssemblyName, md.GetString(md.GetAssemblyDefinition().Name));
            Assert.Equal(new[] { "mscorlib" }, md.AssemblyReferences.Select(h => md.GetString(md.GetAssemblyReference(h).Name)).ToArray());
        }

        using (var pe = new PEReader(File.OpenRead(BoardAssemblyPaths.Board())))
        {
            MetadataReader md = pe.GetMetadataReader();
            string[] references = md.AssemblyReferences.Select(h => md.GetString(md.GetAssemblyReference(h).Name)).OrderBy(n => n, StringComparer.Ordinal).ToArray();
            Assert.Equal(new[] { "FreqReadout.BoardShim.CompileOnly", "FreqReadout.Firmware", "mscorlib" }, references);
        }
    }

    [Fact]
    public void Board_assembly_holds_no_generics_the_runtime_cannot_run()
    {
        // The same rule DeviceAssemblyMetadataTests applies to the portable assembly: nanoFramework 1.17 runs no generics.
        using var pe = new PEReader(File.OpenRead(BoardAssemblyPaths.Board()));
        MetadataReader md = pe.GetMetadataReader();
        Assert.True(md.TypeDefinitions.Count > 5, "board assembly looks empty");
        Assert.Equal(0, md.GetTableRowCount(TableIndex.GenericParam));
        Assert.Equal(0, md.GetTableRowCount(TableIndex.MethodSpec));
        int typeSpecs = md.GetTableRowCount(TableIndex.TypeSpec);
        for (int row = 1; row <= typeSpecs; row++)
        {
            TypeSpecification spec = md.GetTypeSpecification(MetadataTokens.TypeSpecificationHandle(row));
            BlobReader blob = md.GetBlobReader(spec.Signature);
            Assert.True(blob.ReadSignatureTypeCode() != SignatureTypeCode.GenericTypeInstance, "type spec " + row + " of the board assembly is a generic instantiation");
        }
    }

    [Fact]
    public void Portable_device_assembly_holds_no_board_code()
    {
        using var pe = new PEReader(File.OpenRead(DeviceAssemblyMetadataTests.FindDeviceAssembly()));
        MetadataReader md = pe.GetMetadataReader();
        string[] boardTypes = md.TypeDefinitions
            .Select(h => MetadataSignatureText.TypeName(md, h))
            .Where(n => n.StartsWith("FreqReadout.Firmware.Board", StringComparison.Ordinal))
            .ToArray();
        Assert.True(boardTypes.Length == 0, "board types in the portable device assembly: " + string.Join(", ", boardTypes));
        string[] shimReferences = md.AssemblyReferences.Select(h => md.GetString(md.GetAssemblyReference(h).Name)).Where(n => n != "mscorlib").ToArray();
        Assert.Empty(shimReferences);
    }

    [Fact]
    public void Usage_check_names_what_a_board_leaves_unused()
    {
        // A "board" that reads the clock and a pulse count and routes one pin: everything else in the shim is unused.
        const string source = @"
namespace Snippet
{
    public static class Board
    {
        public static long Now(System.Device.Gpio.GpioPulseCounter counter)
        {
            nanoFramework.Hardware.Esp32.Configuration.SetPinFunction(21, nanoFramework.Hardware.Esp32.DeviceFunction.I2C1_DATA);
            System.Device.Gpio.GpioPulseCount read = counter.Read();
            return read.Count + (long)nanoFramework.Hardware.Esp32.HighResTimer.GetCurrent();
        }
    }
}";
        byte[] shim = File.ReadAllBytes(BoardAssemblyPaths.Shim());
        IReadOnlyList<string> unused = BoardShimUsage.FindUnused(shim, CompileAgainstShim(source), source);

        Assert.Contains(unused, u => u == "type System.Device.Gpio.GpioController is not referenced by the board assembly");
        Assert.Contains(unused, u => u == "type System.IO.Ports.SerialPort is not referenced by the board assembly");
        Assert.Contains(unused, u => u == "enum value nanoFramework.Hardware.Esp32.DeviceFunction.COM2_TX is not named in the board sources");
        Assert.Contains(unused, u => u.StartsWith("method System.Device.Gpio.GpioPulseCounter::Start ", StringComparison.Ordinal));
        Assert.Contains(unused, u => u.StartsWith("property System.Device.Gpio.GpioPulseCounter::FilterPulses", StringComparison.Ordinal));
        Assert.Contains(unused, u => u == "field System.Device.Gpio.GpioPulseCount::RelativeTime System.TimeSpan is not used by the board assembly");
        Assert.DoesNotContain(unused, u => u.Contains("HighResTimer", StringComparison.Ordinal));
        Assert.DoesNotContain(unused, u => u.Contains("::Read ", StringComparison.Ordinal) && u.Contains("GpioPulseCounter", StringComparison.Ordinal));
        Assert.DoesNotContain(unused, u => u.Contains("I2C1_DATA", StringComparison.Ordinal));
        Assert.DoesNotContain(unused, u => u.Contains("GpioPulseCount::Count", StringComparison.Ordinal));
    }

    [Fact]
    public void Usage_check_matches_signatures_not_just_names()
    {
        // Calling SerialPort.Write(byte[], int, int) does not make a Write(string) overload used.
        const string extraShim = @"
namespace System.IO.Ports
{
    public sealed class SerialPort
    {
        public SerialPort(string portName) { throw new System.NotImplementedException(); }
        public void Write(byte[] buffer, int offset, int count) { throw new System.NotImplementedException(); }
        public void Write(string text) { throw new System.NotImplementedException(); }
    }
}";
        byte[] shim = Compile(extraShim, BoardAssemblyPaths.ShimAssemblyName, null);
        const string source = @"
namespace Snippet
{
    public static class Board
    {
        public static void Send(byte[] b) { new System.IO.Ports.SerialPort(""COM2"").Write(b, 0, b.Length); }
    }
}";
        byte[] board = Compile(source, "Snippet", shim);
        IReadOnlyList<string> unused = BoardShimUsage.FindUnused(shim, board, source);
        Assert.Equal(new[] { "method System.IO.Ports.SerialPort::Write System.Void(System.String) is not called by the board assembly" }, unused);
    }

    private static byte[] CompileAgainstShim(string source) => Compile(source, "Snippet", File.ReadAllBytes(BoardAssemblyPaths.Shim()));

    private static byte[] Compile(string source, string assemblyName, byte[]? shim)
    {
        string mscorlib = NanoMscorlib.FindPath(DeviceAssemblyMetadataTests.FindDeviceAssembly());
        var references = new List<MetadataReference> { MetadataReference.CreateFromFile(mscorlib) };
        if (shim != null)
        {
            references.Add(MetadataReference.CreateFromImage(shim));
        }

        CSharpCompilation compilation = CSharpCompilation.Create(
            assemblyName,
            [CSharpSyntaxTree.ParseText(source, new CSharpParseOptions(LanguageVersion.CSharp7_3))],
            references,
            new CSharpCompilationOptions(OutputKind.DynamicallyLinkedLibrary, deterministic: true));
        using var image = new MemoryStream();
        Microsoft.CodeAnalysis.Emit.EmitResult result = compilation.Emit(image);
        Assert.True(result.Success, "snippet does not compile:\n" + string.Join("\n", result.Diagnostics.Where(d => d.Severity == DiagnosticSeverity.Error)));
        return image.ToArray();
    }
}
