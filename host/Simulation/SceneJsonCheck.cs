using System.Globalization;
using System.Reflection;
using System.Text.Json;
using System.Text.Json.Serialization.Metadata;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Checks scene JSON against the scene's shape before it is bound, so that every mistake is told in the file's own
/// terms: the file, the JSON path of the key (<c>targets[1].depth_m</c>), what was expected (a whole number, a number,
/// text, true or false, one of the named values, an object, a list) and what was found, never a .NET type name.
/// Keys and value types come from <see cref="Scene.JsonOptions"/>, the same contract the serializer binds with.
/// </summary>
internal static class SceneJsonCheck
{
    private static readonly NullabilityInfoContext Nullability = new();

    /// <summary>Parses and checks <paramref name="json"/>; throws <see cref="SceneException"/> naming the file, the key's path, and what was expected and found.</summary>
    public static void Check(string json, string sourceName)
    {
        JsonDocument document;
        try
        {
            document = JsonDocument.Parse(json, new JsonDocumentOptions { AllowTrailingCommas = true, CommentHandling = JsonCommentHandling.Skip });
        }
        catch (JsonException ex)
        {
            string where = ex.LineNumber.HasValue ? $":{ex.LineNumber.Value + 1}" : string.Empty;
            throw new SceneException($"{sourceName}{where}: not a valid scene file (JSON, see host/Scenes/README.md): {SyntaxProblem(ex)}", ex);
        }

        using (document)
        {
            try
            {
                CheckValue(document.RootElement, typeof(Scene), nullable: false, Root, sourceName);
            }
            catch (PathProblem problem)
            {
                // file:line: path: problem, the line found by walking the text to the key (only when there is an error).
                int line = LineOf(json, problem.Path);
                string where = line > 0 ? $"{sourceName}:{line}" : sourceName;
                string path = problem.Path == Root ? "the scene" : problem.Path;
                throw new SceneException($"{where}: {path}: {problem.Message}");
            }
        }
    }

    /// <summary>The path of the whole document.</summary>
    private const string Root = "";

    /// <summary>A problem at a JSON path (turned into a <see cref="SceneException"/> with the path's line).</summary>
    private sealed class PathProblem : Exception
    {
        public PathProblem(string path, string message)
            : base(message)
        {
            Path = path;
        }

        public string Path { get; }
    }

    /// <summary>The 1-based line of the key (or list item) at <paramref name="path"/>, or 0 when it is not found.</summary>
    private static int LineOf(string json, string path)
    {
        byte[] bytes = System.Text.Encoding.UTF8.GetBytes(json);
        var reader = new Utf8JsonReader(bytes, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Skip, AllowTrailingCommas = true });
        var containers = new List<(bool IsArray, string Path, int Next)>();
        string? member = null;
        int Line(long index) => 1 + bytes.AsSpan(0, (int)index).Count((byte)'\n');
        string ItemPath()
        {
            if (containers.Count == 0)
            {
                return Root;
            }

            var top = containers[^1];
            if (top.IsArray)
            {
                containers[^1] = (true, top.Path, top.Next + 1);
                return $"{top.Path}[{top.Next}]";
            }

            return member ?? top.Path;
        }

        try
        {
            while (reader.Read())
            {
                switch (reader.TokenType)
                {
                    case JsonTokenType.PropertyName:
                        string parent = containers.Count > 0 ? containers[^1].Path : Root;
                        member = parent == Root ? reader.GetString() : $"{parent}.{reader.GetString()}";
                        if (member == path)
                        {
                            return Line(reader.TokenStartIndex);
                        }

                        break;
                    case JsonTokenType.StartObject:
                    case JsonTokenType.StartArray:
                        string at = ItemPath();
                        if (at == path)
                        {
                            return Line(reader.TokenStartIndex);
                        }

                        containers.Add((reader.TokenType == JsonTokenType.StartArray, at, 0));
                        member = null;
                        break;
                    case JsonTokenType.EndObject:
                    case JsonTokenType.EndArray:
                        containers.RemoveAt(containers.Count - 1);
                        member = null;
                        break;
                    default:
                        if (ItemPath() == path)
                        {
                            return Line(reader.TokenStartIndex);
                        }

                        member = null;
                        break;
                }
            }
        }
        catch (JsonException)
        {
            // Checked JSON parses; whatever happens, the message is still right without its line.
        }

        return 0;
    }

    /// <summary>The reader's complaint in plain words (its own text when it names no .NET internals).</summary>
    private static string SyntaxProblem(JsonException ex)
    {
        string message = ex.Message;
        int cut = message.IndexOf(" LineNumber:", StringComparison.Ordinal);
        if (cut > 0)
        {
            message = message[..cut];
        }

        message = message.Trim().TrimEnd('.');
        if (message.Contains("Expected depth to be zero", StringComparison.Ordinal) || message.Contains("end of data", StringComparison.OrdinalIgnoreCase))
        {
            return "the file ends inside an object or a list: a closing } or ] is missing";
        }

        if (message.Contains("does not contain any JSON tokens", StringComparison.Ordinal))
        {
            return "the file holds no JSON; expected a scene object { ... }";
        }

        if (message.Contains("is invalid within a JSON string", StringComparison.Ordinal))
        {
            return "a text value holds a line break or another control character; write it as \\n or leave it out";
        }

        return message;
    }

    private static void CheckValue(JsonElement value, Type type, bool nullable, string path, string source)
    {
        Type? underlying = Nullable.GetUnderlyingType(type);
        if (underlying != null)
        {
            type = underlying;
            nullable = true;
        }

        if (value.ValueKind == JsonValueKind.Null)
        {
            if (!nullable)
            {
                Fail(source, path, Expected(type) + " (or leave the key out for its default)", value);
            }

            return;
        }

        if (type == typeof(string))
        {
            if (value.ValueKind != JsonValueKind.String)
            {
                Fail(source, path, "text in quotes", value);
            }

            return;
        }

        if (type == typeof(bool))
        {
            if (value.ValueKind is not (JsonValueKind.True or JsonValueKind.False))
            {
                Fail(source, path, "true or false", value);
            }

            return;
        }

        if (type == typeof(int) || type == typeof(long))
        {
            bool ok = value.ValueKind == JsonValueKind.Number && (type == typeof(int) ? value.TryGetInt32(out _) : value.TryGetInt64(out _));
            if (!ok)
            {
                bool whole = value.ValueKind == JsonValueKind.Number && value.TryGetDecimal(out decimal d) && decimal.Truncate(d) == d;
                Fail(source, path, whole ? Expected(type) + " of a size the setting can hold" : Expected(type), value);
            }

            return;
        }

        if (type == typeof(double))
        {
            bool named = value.ValueKind == JsonValueKind.String && value.GetString() is "NaN" or "Infinity" or "-Infinity";
            if (value.ValueKind != JsonValueKind.Number && !named)
            {
                Fail(source, path, Expected(type), value);
            }

            return;
        }

        if (type == typeof(DateTimeOffset))
        {
            if (value.ValueKind != JsonValueKind.String || !value.TryGetDateTimeOffset(out _))
            {
                Fail(source, path, Expected(type), value);
            }

            return;
        }

        if (type.IsEnum)
        {
            string[] names = EnumNames(type);
            if (value.ValueKind != JsonValueKind.String || Array.IndexOf(names, value.GetString()) < 0)
            {
                Fail(source, path, Expected(type), value);
            }

            return;
        }

        if (type.IsGenericType && type.GetGenericTypeDefinition() == typeof(List<>))
        {
            if (value.ValueKind != JsonValueKind.Array)
            {
                Fail(source, path, Expected(type), value);
            }

            Type item = type.GetGenericArguments()[0];
            int i = 0;
            foreach (JsonElement element in value.EnumerateArray())
            {
                CheckValue(element, item, nullable: false, $"{path}[{i}]", source);
                i++;
            }

            return;
        }

        if (value.ValueKind != JsonValueKind.Object)
        {
            Fail(source, path, Expected(type), value);
        }

        JsonTypeInfo info = Scene.JsonOptions.GetTypeInfo(type);
        var keys = new Dictionary<string, JsonPropertyInfo>(StringComparer.Ordinal);
        foreach (JsonPropertyInfo property in info.Properties)
        {
            keys[property.Name] = property;
        }

        foreach (JsonProperty member in value.EnumerateObject())
        {
            string memberPath = path == Root ? member.Name : $"{path}.{member.Name}";
            if (!keys.TryGetValue(member.Name, out JsonPropertyInfo? property))
            {
                throw new PathProblem(memberPath, $"unknown key {TextExcerpt.Quote(member.Name)}; expected one of {string.Join(", ", keys.Keys)}{(path == Root ? " at the top" : " in " + path)}");
            }

            bool propertyNullable = property.AttributeProvider is PropertyInfo p
                && Nullability.Create(p).WriteState == NullabilityState.Nullable;
            CheckValue(member.Value, property.PropertyType, propertyNullable, memberPath, source);
        }
    }

    private static string[] EnumNames(Type type) =>
        Enum.GetNames(type).Select(n => JsonNamingPolicy.SnakeCaseLower.ConvertName(n)).ToArray();

    /// <summary>What a value of <paramref name="type"/> looks like in the file.</summary>
    private static string Expected(Type type)
    {
        if (type == typeof(int))
        {
            return "a whole number";
        }

        if (type == typeof(long))
        {
            return "a whole number";
        }

        if (type == typeof(double))
        {
            return "a number";
        }

        if (type == typeof(string))
        {
            return "text in quotes";
        }

        if (type == typeof(bool))
        {
            return "true or false";
        }

        if (type == typeof(DateTimeOffset))
        {
            return "a date and time in quotes, such as \"2026-03-01T09:30:00Z\"";
        }

        if (type.IsEnum)
        {
            return "one of " + string.Join(", ", EnumNames(type).Select(n => "\"" + n + "\""));
        }

        if (type.IsGenericType && type.GetGenericTypeDefinition() == typeof(List<>))
        {
            return "a list [ ... ]";
        }

        return "an object { ... }";
    }

    private static void Fail(string source, string path, string expected, JsonElement found) =>
        throw new PathProblem(path, $"expected {expected}, found {Describe(found)}");

    /// <summary>The value found, in the file's terms: its kind and a short, escaped excerpt.</summary>
    private static string Describe(JsonElement value) => value.ValueKind switch
    {
        JsonValueKind.Null => "null",
        JsonValueKind.True => "true",
        JsonValueKind.False => "false",
        JsonValueKind.Number => "the number " + TextExcerpt.Plain(value.GetRawText()),
        JsonValueKind.String => "the text " + TextExcerpt.Quote(value.GetString() ?? string.Empty),
        JsonValueKind.Array => $"a list of {value.GetArrayLength().ToString(CultureInfo.InvariantCulture)} item{(value.GetArrayLength() == 1 ? string.Empty : "s")}",
        JsonValueKind.Object => "an object { ... }",
        _ => "nothing",
    };
}
