using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;
using FreqReadout.Settings;
using Moq;

namespace FreqReadout.Firmware.Tests;

/// <summary>What the device does with its store at start and when the PC sends settings, against a fake store.</summary>
public class SettingsStorageTests
{
    private const string Good = SettingsKeys.MagicLine + "\ngate_s=0.5\nread_rate_hz=500\n";
    private const string OneBad = SettingsKeys.MagicLine + "\ngate_s=banana\nread_rate_hz=500\n";

    private static DeviceSettings Defaults() =>
        new(new CounterSettings { ClockHz = 1_000_000, GateSeconds = 0.1, JitterTicks = 0.5 }, new ReadoutSettings()) { MaxEdgesPerStep = 10_000 };

    /// <summary>An in-memory store whose parts can be made to fail or throw.</summary>
    private sealed class FakeStore : ISettingsStore
    {
        public string? Text;
        public bool HasCount;
        public uint Count;
        public bool FailReads, FailWrites, Throw;
        public int Writes;

        public bool TryLoad(out string text)
        {
            if (Throw) throw new IOException("flash gone");
            text = FailReads ? null! : Text!;
            return !FailReads && Text != null;
        }

        public bool TrySave(string text)
        {
            if (Throw) throw new IOException("flash gone");
            Writes++;
            if (FailWrites) return false;
            Text = text;
            return true;
        }

        public bool TryReadBootCount(out uint count)
        {
            if (Throw) throw new IOException("flash gone");
            count = Count;
            return HasCount && !FailReads;
        }

        public bool TryWriteBootCount(uint count)
        {
            if (Throw) throw new IOException("flash gone");
            if (FailWrites) return false;
            Count = count;
            HasCount = true;
            return true;
        }
    }

    [Fact]
    public void A_stored_text_is_in_force_before_the_loop_is_built()
    {
        var settings = Defaults();
        var result = new SettingsStorage(new FakeStore { Text = Good }).LoadInto(settings, null);
        Assert.Equal(StoredSettingsResult.Applied, result);
        Assert.Equal(0.5, settings.Counter.GateSeconds);
        Assert.Equal(500, settings.ReadRateHz);
        Assert.NotNull(settings.SettingsText);
        Assert.Equal(0, settings.SettingsProblems);
    }

    [Fact]
    public void An_invalid_stored_value_falls_back_to_its_default_and_is_counted()
    {
        var settings = Defaults();
        var problems = new SettingsProblemList();
        var result = new SettingsStorage(new FakeStore { Text = OneBad }).LoadInto(settings, problems);
        Assert.Equal(StoredSettingsResult.Applied, result);
        Assert.Equal(1, settings.SettingsProblems);
        Assert.Equal(500, settings.ReadRateHz);                       // the good value still applies
        Assert.NotEqual(0.5, settings.Counter.GateSeconds);
        Assert.True(settings.TryValidate(out _));
        new DeviceLoop(settings, new QueueEdgeSource(), new QueueEdgeSource(), Mock.Of<IDisplayPort>(), Mock.Of<IButtonPort>()); // builds
    }

    [Fact]
    public void A_damaged_file_keeps_the_defaults_and_counts_a_problem()
    {
        var settings = Defaults();
        var result = new SettingsStorage(new FakeStore { Text = "\u0000\u00ffgate_s=0.5" }).LoadInto(settings, null);
        Assert.Equal(StoredSettingsResult.NotSettings, result);
        Assert.Equal(0.1, settings.Counter.GateSeconds);
        Assert.True(settings.SettingsProblems >= 1);
    }

    [Fact]
    public void A_missing_unreadable_throwing_or_absent_store_just_leaves_the_defaults()
    {
        foreach (var storage in new[]
                 {
                     new SettingsStorage(new FakeStore()),
                     new SettingsStorage(new FakeStore { Text = Good, FailReads = true }),
                     new SettingsStorage(new FakeStore { Text = Good, Throw = true }),
                     new SettingsStorage(null),
                 })
        {
            var settings = Defaults();
            Assert.Equal(StoredSettingsResult.Missing, storage.LoadInto(settings, null));
            Assert.Equal(0.1, settings.Counter.GateSeconds);
            Assert.Equal(0, settings.SettingsProblems);
            Assert.Null(settings.SettingsText);
        }
    }

    [Fact]
    public void The_boot_id_is_the_incremented_stored_counter()
    {
        var store = new FakeStore();
        var storage = new SettingsStorage(store);
        Assert.Equal(1u, storage.NextBootId(777));                     // first start
        Assert.True(storage.BootIdFromStore);
        Assert.Equal(2u, storage.NextBootId(777));
        Assert.Equal(3u, new SettingsStorage(store).NextBootId(777));  // a restart reads what was stored
        store.Count = uint.MaxValue;
        Assert.Equal(1u, storage.NextBootId(777));                     // wraps past zero
        store.FailReads = true;                                        // a damaged counter starts again
        Assert.Equal(1u, storage.NextBootId(777));
    }

    [Fact]
    public void The_boot_id_falls_back_to_the_drawn_number_when_storage_fails()
    {
        var failing = new SettingsStorage(new FakeStore { HasCount = true, Count = 5, FailWrites = true });
        Assert.Equal(777u, failing.NextBootId(777));                   // an increment that cannot be kept would repeat
        Assert.False(failing.BootIdFromStore);
        Assert.Equal(778u, new SettingsStorage(new FakeStore { Throw = true }).NextBootId(778));
        Assert.Equal(779u, new SettingsStorage(null).NextBootId(779));
    }

    [Fact]
    public void Settings_from_the_PC_are_stored_once_and_a_failed_save_is_counted()
    {
        var store = new FakeStore();
        var storage = new SettingsStorage(store);
        var loop = new DeviceLoop(Defaults(), new QueueEdgeSource(), new QueueEdgeSource(), Mock.Of<IDisplayPort>(), Mock.Of<IButtonPort>());
        Assert.False(storage.SaveFrom(loop));                          // nothing new
        Assert.True(loop.ApplySettingsText(Good));
        Assert.True(storage.SaveFrom(loop));
        Assert.False(storage.SaveFrom(loop));                          // once
        Assert.Equal(1, store.Writes);
        Assert.Contains("gate_s=0.5", store.Text);

        var reloaded = Defaults();                                     // the next start puts them in force again
        Assert.Equal(StoredSettingsResult.Applied, new SettingsStorage(store).LoadInto(reloaded, null));
        Assert.Equal(0.5, reloaded.Counter.GateSeconds);

        store.FailWrites = true;
        Assert.True(loop.ApplySettingsText(Good.Replace("0.5", "0.25")));
        Assert.False(storage.SaveFrom(loop));
        Assert.Equal(1, storage.SaveFailures);
        Assert.Equal(1, storage.Saves);
        store.Throw = true;
        Assert.True(loop.ApplySettingsText(Good));
        Assert.False(storage.SaveFrom(loop));                          // a throwing store does not stop the loop
        Assert.Equal(2, storage.SaveFailures);
    }

    [Theory]
    [InlineData("0", true, 0u)]
    [InlineData("42\n", true, 42u)]
    [InlineData("42\r\n", true, 42u)]
    [InlineData("4294967295", true, 4294967295u)]
    [InlineData("4294967296", false, 0u)]
    [InlineData("99999999999", false, 0u)]
    [InlineData("", false, 0u)]
    [InlineData("-1", false, 0u)]
    [InlineData("12a", false, 0u)]
    [InlineData(" 12", false, 0u)]
    public void Boot_count_text_round_trips_and_refuses_anything_else(string text, bool ok, uint value)
    {
        Assert.Equal(ok, BootCountText.TryParse(text, out uint count));
        Assert.Equal(value, count);
        if (ok)
        {
            Assert.True(BootCountText.TryParse(BootCountText.Format(count), out uint again));
            Assert.Equal(count, again);
        }
    }
}
