namespace FreqReadout.Settings
{
    /// <summary>
    /// The problems of one settings read, in the order found: a fixed number of entries made once
    /// (<see cref="Capacity"/>), refilled by each read; problems beyond the capacity are only counted
    /// (<see cref="TotalCount"/>), so a text full of garbage cannot use up the device's memory.
    /// </summary>
    public sealed class SettingsProblemList
    {
        /// <summary>Entries kept by the parameterless constructor.</summary>
        public const int DefaultCapacity = 16;

        /// <summary>Longest key kept in a problem, characters (an unknown key may be any text).</summary>
        public const int MaxKeyChars = 32;

        private readonly SettingsProblem[] entries;
        private int count;
        private int totalCount;

        /// <summary>A list of <see cref="DefaultCapacity"/> entries.</summary>
        public SettingsProblemList()
            : this(DefaultCapacity)
        {
        }

        /// <summary>A list of <paramref name="capacity"/> entries (at least 1).</summary>
        /// <param name="capacity">Problems kept; more are counted only.</param>
        public SettingsProblemList(int capacity)
        {
            entries = new SettingsProblem[capacity < 1 ? 1 : capacity];
            for (int i = 0; i < entries.Length; i++)
            {
                entries[i] = new SettingsProblem();
            }
        }

        /// <summary>Entries this list keeps.</summary>
        public int Capacity
        {
            get { return entries.Length; }
        }

        /// <summary>Problems kept, 0 to <see cref="Capacity"/>.</summary>
        public int Count
        {
            get { return count; }
        }

        /// <summary>Problems found, the ones not kept included (&gt;= <see cref="Count"/>).</summary>
        public int TotalCount
        {
            get { return totalCount; }
        }

        /// <summary>The problem at <paramref name="index"/> (0 to <see cref="Count"/> - 1), in the order found; null outside that range.</summary>
        public SettingsProblem Get(int index)
        {
            return index >= 0 && index < count ? entries[index] : null;
        }

        /// <summary>Forgets every problem (the entries are reused).</summary>
        public void Clear()
        {
            count = 0;
            totalCount = 0;
        }

        /// <summary>Records a problem, or only counts it when the list is full.</summary>
        internal void Add(int lineNumber, string key, string message)
        {
            totalCount++;
            if (count == entries.Length)
            {
                return;
            }

            SettingsProblem p = entries[count++];
            p.LineNumber = lineNumber;
            p.Key = CleanKey(key);
            p.Message = message;
        }

        /// <summary>The key as kept: at most <see cref="MaxKeyChars"/> characters, printable ASCII, others as '?'.</summary>
        private static string CleanKey(string key)
        {
            if (key == null)
            {
                return string.Empty;
            }

            int n = key.Length < MaxKeyChars ? key.Length : MaxKeyChars;
            if (n == 0)
            {
                return string.Empty;
            }

            char[] chars = new char[n];
            for (int i = 0; i < n; i++)
            {
                char c = key[i];
                chars[i] = c >= ' ' && c <= '~' ? c : '?';
            }

            return new string(chars, 0, n);
        }
    }
}
