using System.Text;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Captures;

/// <summary>Helpers: the contract samples copied beside the tests, and readers over in-memory text.</summary>
internal static class CaptureTestFiles
{
    /// <summary>Folder of the contract samples in the test output: docs/contracts, copied there by the csproj.</summary>
    public static string ContractsDir => Path.Combine(AppContext.BaseDirectory, "Data", "contracts");

    public static string Contract(string name) => Path.Combine(ContractsDir, name);

    /// <summary>A text reader over UTF-8 bytes of <paramref name="text"/>.</summary>
    public static TextCaptureReader ReadText(string text, string source = "test.csv")
    {
        return new TextCaptureReader(new MemoryStream(Encoding.UTF8.GetBytes(text)), source);
    }

    /// <summary>Reads every row (throws what the reader throws).</summary>
    public static List<CaptureRow> AllRows(string text, string source = "test.csv")
    {
        using var reader = ReadText(text, source);
        return reader.ReadRows().ToList();
    }

    /// <summary>The exception of reading the whole capture, header and rows; fails when none is thrown.</summary>
    public static CaptureFormatException ErrorOf(string text, string source = "test.csv")
    {
        return Assert.Throws<CaptureFormatException>(() => AllRows(text, source));
    }

    /// <summary>The exception of reading a whole file; fails when none is thrown.</summary>
    public static CaptureFormatException ErrorOfFile(string path)
    {
        return Assert.Throws<CaptureFormatException>(() =>
        {
            using var reader = CaptureFile.Open(path);
            foreach (var unused in reader.ReadRows())
            {
            }
        });
    }
}
