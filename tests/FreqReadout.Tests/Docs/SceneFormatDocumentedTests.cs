using System.Globalization;
using System.Text.Json;
using System.Text.Json.Serialization;
using System.Text.RegularExpressions;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Docs;

/// <summary>
/// docs/scene-format.md against the scene code: the key table lists exactly the keys a scene file has, its
/// defaults are the code's, every part may be left out (or given empty) as the page says, the conditionally
/// required keys are the ones it names, and its example is a valid scene.
/// </summary>
public sealed class SceneFormatDocumentedTests
{
    /// <summary>Scene JSON with every key written (null where unset), as the truth file's <c>parameters</c>.</summary>
    private static readonly JsonSerializerOptions EveryKey = new(Scene.JsonOptions) { DefaultIgnoreCondition = JsonIgnoreCondition.Never };

    /// <summary>A scene with every optional part present and one of each array element, all at their defaults.</summary>
    private static Scene DefaultsEverywhere()
    {
        var scene = new Scene { Reference = new SceneReference() };
        scene.Targets.Add(new SceneTarget());
        scene.Temperature.Points.Add(new TemperaturePoint());
        return scene;
    }

    [Fact]
    public void The_key_table_lists_exactly_the_keys_of_a_scene_file()
    {
        var printed = new SortedSet<string>(StringComparer.Ordinal);
        DocTables.AddDocument(JsonSerializer.Serialize(DefaultsEverywhere(), EveryKey), printed, "reference.temperature");
        var documented = DocTables.Keys("scene-format.md", "keys: scene");
        Assert.True(
            documented.SetEquals(printed),
            $"in the code, not the page: [{string.Join(", ", printed.Except(documented))}]; on the page, not in the code: [{string.Join(", ", documented.Except(printed))}]");

        // reference.temperature is documented as a temperature object: it has exactly the keys of temperature.
        var temperature = new SortedSet<string>(printed.Where(p => p.StartsWith("temperature.", StringComparison.Ordinal)).Select(p => p["temperature.".Length..]), StringComparer.Ordinal);
        var inner = new SortedSet<string>(StringComparer.Ordinal);
        var withPoint = DefaultsEverywhere();
        withPoint.Reference!.Temperature.Points.Add(new TemperaturePoint());
        using var doc = JsonDocument.Parse(JsonSerializer.Serialize(withPoint, EveryKey));
        DocTables.AddPaths(doc.RootElement.GetProperty("reference").GetProperty("temperature"), string.Empty, inner);
        Assert.Equal(temperature, inner);
    }

    [Fact]
    public void Every_default_on_the_page_is_the_codes_default()
    {
        using var doc = JsonDocument.Parse(JsonSerializer.Serialize(DefaultsEverywhere(), EveryKey));
        string[] lines = DocTables.Doc("scene-format.md").Split('\n');
        int at = Array.FindIndex(lines, l => l.Trim() == "<!-- keys: scene -->");
        int checkedDefaults = 0;
        for (int i = at + 3; i < lines.Length && lines[i].StartsWith('|'); i++)
        {
            string[] cells = lines[i].Split('|');
            string key = Regex.Match(cells[1], "`([^`]+)`").Groups[1].Value;
            Match literal = Regex.Match(cells[4], "^\\s*`([^`]+)`");
            JsonElement value = At(doc.RootElement, key);
            if (!literal.Success)
            {
                // No literal default: the code's value is unset (null) or a structure the text describes.
                Assert.True(value.ValueKind is JsonValueKind.Null or JsonValueKind.Object or JsonValueKind.Array || key == "reference.frequency_hz",
                    $"{key}: the page gives no default, the code has {value.GetRawText()}");
                continue;
            }

            string text = literal.Groups[1].Value;
            checkedDefaults++;
            switch (value.ValueKind)
            {
                case JsonValueKind.Number:
                    Assert.True(double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out double d) && d == value.GetDouble(), $"{key}: page {text}, code {value.GetRawText()}");
                    break;
                case JsonValueKind.String:
                    Assert.True(text == value.GetString(), $"{key}: page {text}, code {value.GetRawText()}");
                    break;
                case JsonValueKind.True:
                case JsonValueKind.False:
                    Assert.True(text == value.GetRawText(), $"{key}: page {text}, code {value.GetRawText()}");
                    break;
                case JsonValueKind.Array:
                    Assert.Equal("[]", text);
                    Assert.True(key is "targets" or "temperature.points", key + " has a page default of [] but is not an array left empty by default");
                    break;
                default:
                    Assert.Fail($"{key}: page default {text}, code {value.GetRawText()}");
                    break;
            }
        }

        Assert.True(checkedDefaults >= 55, "expected most keys to have a literal default, checked " + checkedDefaults);
    }

    /// <summary>The value at a documented path; for <c>a[].b</c> the first element's (the defaults scene has one of each).</summary>
    private static JsonElement At(JsonElement root, string path)
    {
        JsonElement e = root;
        foreach (string part in path.Split('.'))
        {
            bool array = part.EndsWith("[]", StringComparison.Ordinal);
            e = e.GetProperty(array ? part[..^2] : part);
            if (array)
            {
                e = e[0];
            }
        }

        return e;
    }

    [Theory]
    [InlineData("{}")]
    [InlineData("{ \"coil\": {}, \"oscillator\": {}, \"temperature\": {}, \"sweep\": {}, \"hardware\": {}, \"faults\": {} }")]
    [InlineData("{ \"targets\": [ {} ], \"temperature\": { \"points\": [ {} ] } }")]
    [InlineData("{ \"reference\": { \"frequency_hz\": 100400 } }")]
    [InlineData("{ \"reference\": null }")]
    [InlineData("{ \"oscillator\": { \"tempco_ppm_per_k\": -3 } }")]
    public void Parts_and_keys_left_out_take_their_defaults(string json)
    {
        Scene scene = Scene.Parse(json, "s.json");
        var model = new SceneModel(scene, "s.json");
        Assert.Equal(100_000.0, model.SearchNominalHz); // the default oscillator, whether the object is left out or empty

        // A part given empty is the part left out: the same scene, key for key (Scene.Parse gives an empty
        // oscillator object the default frequency_hz, so the two are now equal as written, with no exception).
        var empty = Scene.Parse("{ \"coil\": {}, \"oscillator\": {}, \"temperature\": {}, \"sweep\": {}, \"hardware\": {}, \"faults\": {} }", "e.json");
        var none = Scene.Parse("{}", "n.json");
        Assert.Equal(JsonSerializer.Serialize(none, EveryKey), JsonSerializer.Serialize(empty, EveryKey));
        Assert.Equal(new SceneModel(none).SearchNominalHz, new SceneModel(empty).SearchNominalHz);
        Assert.Equal(new SceneModel(none).CapacitanceF, new SceneModel(empty).CapacitanceF);
    }

    [Theory]
    [InlineData("{ \"reference\": {} }", "reference.frequency_hz")]
    [InlineData("{ \"targets\": [ { \"shape\": \"pipe\" } ] }", "targets[0].length_m")]
    [InlineData("{ \"temperature\": { \"kind\": \"steps\" } }", "temperature.points")]
    [InlineData("{ \"temperature\": { \"kind\": \"ramps\" } }", "temperature.points")]
    [InlineData("{ \"reference\": { \"frequency_hz\": 90000, \"temperature\": { \"kind\": \"steps\" } } }", "reference.temperature.points")]
    [InlineData("{ \"oscillator\": { \"capacitor\": \"custom\" } }", "oscillator.capacitor_ppm_per_k")]
    [InlineData("{ \"hardware\": { \"timestamp_method\": \"custom\" } }", "hardware.jitter_s")]
    [InlineData("{ \"targets\": [ { \"material\": \"custom\" } ] }", "conductivity_s_per_m")]
    // A null part is now refused by the JSON shape check (file, line, path) before binding, in its own words.
    [InlineData("{ \"coil\": null }", "coil: expected an object")]
    public void The_conditionally_required_keys_are_the_ones_the_page_names(string json, string named)
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "s.json"));
        Assert.Contains(named, ex.Message);
        if (!named.Contains(' ', StringComparison.Ordinal))
        {
            string key = named.Replace("[0]", "[]");
            string page = DocTables.Doc("scene-format.md");
            string required = page[page.IndexOf("| key | required when |", StringComparison.Ordinal)..page.IndexOf("A part may not be", StringComparison.Ordinal)];
            Assert.True(required.Contains(key.StartsWith("reference.temperature", StringComparison.Ordinal) ? "temperature.points" : key, StringComparison.Ordinal), key + " is not in the page's table of conditionally required keys");
        }
    }

    [Fact]
    public void A_capacitor_tempco_given_with_a_direct_tempco_is_not_required()
    {
        Scene.Parse("{ \"oscillator\": { \"capacitor\": \"custom\", \"tempco_ppm_per_k\": 4 } }", "s.json");
    }

    [Theory]
    [InlineData("{ \"oscillator\": { \"coil_ppm_per_k\": 1e6 } }", "oscillator.coil_ppm_per_k must be in [-10000, 10000] ppm/K")]
    [InlineData("{ \"oscillator\": { \"capacitor_ppm_per_k\": \"NaN\" } }", "oscillator.capacitor_ppm_per_k must be in [-10000, 10000] ppm/K")]
    [InlineData("{ \"oscillator\": { \"nominal_temperature_c\": -300 } }", "oscillator.nominal_temperature_c must be in (-100, 200) deg C")]
    [InlineData("{ \"reference\": { \"frequency_hz\": 90000, \"nominal_temperature_c\": 500 } }", "reference.nominal_temperature_c must be in (-100, 200) deg C")]
    [InlineData("{ \"temperature\": { \"kind\": \"settling\", \"time_constant_s\": \"Infinity\" } }", "temperature.time_constant_s must be in (0, 1e7] s")]
    // Point times got a physical range (a week, as duration_s) with the wrong-number guards; the message names it.
    [InlineData("{ \"temperature\": { \"kind\": \"steps\", \"points\": [ { \"time_s\": \"Infinity\", \"temp_c\": 20 } ] } }", "temperature.points[0].time_s must be increasing, in [0, 604800] s")]
    [InlineData("{ \"oscillator\": { \"frequency_hz\": 1e5, \"tuning_capacitance_nf\": 3 } }", "at most one of the two")]
    public void Keys_with_a_range_on_the_page_are_checked_against_it(string json, string expected)
    {
        var ex = Assert.Throws<SceneException>(() => Scene.Parse(json, "s.json"));
        Assert.Contains(expected, ex.Message);
    }

    [Fact]
    public void The_pages_example_is_a_valid_scene()
    {
        string page = DocTables.Doc("scene-format.md");
        Match m = Regex.Match(page, "```json\\n(?<json>.*?)```", RegexOptions.Singleline);
        Assert.True(m.Success, "no json example on the page");
        Scene scene = Scene.Parse(m.Groups["json"].Value, "example");
        var model = new SceneModel(scene);
        Assert.Equal(90_000.0, model.SearchNominalHz);
        Assert.Equal(TargetShape.Pipe, Assert.Single(scene.Targets).Shape);
    }

    [Fact]
    public void The_scene_README_points_to_the_page_and_makes_no_claim_of_its_own_about_defaults()
    {
        string readme = File.ReadAllText(Path.Combine(CliProcess.RepoRoot(), "host", "Scenes", "README.md"));
        Assert.Contains("docs/scene-format.md", readme);
        Assert.DoesNotContain("Every part may be left out and takes the defaults shown", readme);
    }
}
