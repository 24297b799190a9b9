using System.Reflection;
using FreqReadout.Host.Recording;

namespace FreqReadout.Tests.Docs;

/// <summary>The trailer keys a recording writes are exactly those docs/capture-text-format.md lists.</summary>
public sealed class RecordingTrailerDocumentedTests
{
    [Fact]
    public void Every_trailer_key_of_a_recording_is_documented_and_nothing_else()
    {
        var inCode = typeof(RecordingTrailerKeys).GetFields(BindingFlags.Public | BindingFlags.Static)
            .Where(f => f.IsLiteral && f.FieldType == typeof(string))
            .Select(f => (string)f.GetRawConstantValue()!)
            .OrderBy(k => k, StringComparer.Ordinal);
        var documented = DocTables.Keys("capture-text-format.md", "keys: recording-trailer").OrderBy(k => k, StringComparer.Ordinal);
        Assert.Equal(inCode, documented);
    }
}
