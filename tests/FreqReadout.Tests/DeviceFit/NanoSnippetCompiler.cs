using Microsoft.CodeAnalysis;
using Microsoft.CodeAnalysis.CSharp;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>Compiles a small C# source against nanoFramework's mscorlib (no other reference), as the firmware build does, into an assembly image.</summary>
internal static class NanoSnippetCompiler
{
    public static byte[] Compile(string source, string mscorlibPath, OptimizationLevel optimization = OptimizationLevel.Release)
    {
        SyntaxTree tree = CSharpSyntaxTree.ParseText(source, new CSharpParseOptions(LanguageVersion.CSharp7_3));
        CSharpCompilation compilation = CSharpCompilation.Create(
            "Snippet",
            [tree],
            [MetadataReference.CreateFromFile(mscorlibPath)],
            new CSharpCompilationOptions(OutputKind.DynamicallyLinkedLibrary, optimizationLevel: optimization, deterministic: true));
        using var image = new MemoryStream();
        Microsoft.CodeAnalysis.Emit.EmitResult result = compilation.Emit(image);
        if (!result.Success)
        {
            throw new InvalidOperationException("snippet does not compile against " + mscorlibPath + ":\n"
                + string.Join("\n", result.Diagnostics.Where(d => d.Severity == DiagnosticSeverity.Error)));
        }

        return image.ToArray();
    }
}
