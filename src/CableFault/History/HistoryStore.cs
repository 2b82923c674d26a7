using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using CableFault.Traces;
using Microsoft.Data.Sqlite;

namespace CableFault.History;

/// <summary>
/// The run history: every stored trace of every run, and each run's baselines, in one SQLite file.
/// Every write is one IMMEDIATE transaction (all or nothing, also when the process is killed); the journal is WAL, so
/// readers never block the writer; a second writer waits up to the busy timeout and then gets a "busy, try again"
/// <see cref="InputException"/>. A file that is not ours (not SQLite, or SQLite without our application id) is
/// reported in one line and never written to.
/// </summary>
public sealed class HistoryStore : IDisposable
{
    private const string TimeFormat = "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'";
    private static readonly byte[] SqliteHeader = "SQLite format 3\0"u8.ToArray();

    private readonly SqliteConnection _connection;
    private readonly HistoryStoreOptions _options;

    /// <summary>The database file.</summary>
    public string DatabasePath { get; }

    private HistoryStore(string path, SqliteConnection connection, HistoryStoreOptions options)
    {
        DatabasePath = path;
        _connection = connection;
        _options = options;
    }

    /// <summary>True when a history database file exists at <paramref name="path"/> (it may still be foreign).</summary>
    public static bool Exists(string path) => File.Exists(path);

    /// <summary>
    /// Opens the history at <paramref name="path"/>, creating it (and its schema) when the file is missing or empty, and
    /// migrating an older schema. Throws <see cref="InputException"/> for a foreign, damaged, newer or busy database.
    /// </summary>
    public static HistoryStore Open(string path, HistoryStoreOptions? options = null)
    {
        options ??= new HistoryStoreOptions();
        if (options.BusyTimeoutMilliseconds < 0) throw new ArgumentOutOfRangeException(nameof(options), "busy timeout must be 0 or more");
        bool exists = File.Exists(path);
        if (!exists && !options.CreateIfMissing)
            throw new InputException($"{path}: no history database here yet; store a trace first with 'cablefault history add', or give --db");
        if (exists) RejectIfNotSqlite(path);
        if (!exists)
        {
            string? folder = Path.GetDirectoryName(Path.GetFullPath(path));
            if (folder is not null) Directory.CreateDirectory(folder);
        }

        var builder = new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Mode = SqliteOpenMode.ReadWriteCreate,
            // No pooling: a killed or finished process must leave nothing open, and tests delete their files.
            Pooling = false,
            // Microsoft.Data.Sqlite retries SQLITE_BUSY itself for up to the command timeout (whole seconds).
            DefaultTimeout = Math.Max(1, (options.BusyTimeoutMilliseconds + 999) / 1000),
        };
        var connection = new SqliteConnection(builder.ToString());
        var store = new HistoryStore(path, connection, options);
        try
        {
            Guard(path, () =>
            {
                connection.Open();
                store.Execute($"PRAGMA busy_timeout = {options.BusyTimeoutMilliseconds.ToString(CultureInfo.InvariantCulture)}");
                store.PrepareSchema();
                return 0;
            });
            return store;
        }
        catch
        {
            store.Dispose();
            throw;
        }
    }

    /// <summary>A non-empty file that does not start with the SQLite header is someone else's: say so, touch nothing.</summary>
    private static void RejectIfNotSqlite(string path)
    {
        var header = new byte[SqliteHeader.Length];
        int read;
        try
        {
            using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete);
            read = stream.ReadAtLeast(header, header.Length, throwOnEndOfStream: false);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"{path}: cannot read the history database ({e.Message}); check the path and its permissions", e);
        }
        if (read == 0) return; // an empty file is an empty database: SQLite itself treats it so
        if (read < header.Length || !header.AsSpan().SequenceEqual(SqliteHeader))
            throw new InputException($"{path}: not a CableFault history database (not an SQLite file); left untouched; give another --db or move the file away");
    }

    private void PrepareSchema()
    {
        // Read-only look first: a foreign or newer database must not be written to at all (not even the journal mode).
        var (applicationId, version, objects) = ReadIdentity();
        CheckIdentity(applicationId, version, objects);
        if (applicationId == HistorySchema.ApplicationId && version == HistorySchema.CurrentVersion)
        {
            Execute("PRAGMA journal_mode = WAL");
            Execute("PRAGMA synchronous = FULL");
            Execute("PRAGMA foreign_keys = ON");
            return;
        }

        Execute("PRAGMA journal_mode = WAL");
        Execute("PRAGMA synchronous = FULL");
        Execute("PRAGMA foreign_keys = ON");
        using var transaction = _connection.BeginTransaction(deferred: false);
        // Look again inside the write lock: another process may have created or migrated the schema meanwhile.
        (applicationId, version, objects) = ReadIdentity();
        CheckIdentity(applicationId, version, objects);
        if (applicationId == 0) Execute($"PRAGMA application_id = {HistorySchema.ApplicationId.ToString(CultureInfo.InvariantCulture)}");
        for (int v = version; v < HistorySchema.CurrentVersion; v++)
            foreach (string statement in HistorySchema.Migrations[v]) Execute(statement);
        Execute($"PRAGMA user_version = {HistorySchema.CurrentVersion.ToString(CultureInfo.InvariantCulture)}");
        transaction.Commit();
    }

    /// <summary>The file's identity in one statement, so one read snapshot: read as three statements, a process opening
    /// the file while another creates the schema could see the old application id beside the new tables and take the
    /// file for a foreign database.</summary>
    private (int ApplicationId, int Version, long Objects) ReadIdentity()
    {
        using var command = Command("SELECT (SELECT application_id FROM pragma_application_id()), " +
            "(SELECT user_version FROM pragma_user_version()), (SELECT count(*) FROM sqlite_master)");
        using var reader = command.ExecuteReader();
        reader.Read();
        return ((int)reader.GetInt64(0), (int)reader.GetInt64(1), reader.GetInt64(2));
    }

    private void CheckIdentity(int applicationId, int version, long objects)
    {
        bool empty = applicationId == 0 && version == 0 && objects == 0;
        if (empty) return;
        if (applicationId != HistorySchema.ApplicationId)
            throw new InputException($"{DatabasePath}: an SQLite database, but not a CableFault history (no CableFault schema); left untouched; give another --db");
        if (version > HistorySchema.CurrentVersion)
            throw new InputException($"{DatabasePath}: history schema version {version} was written by a newer CableFault (this one knows up to {HistorySchema.CurrentVersion}); update CableFault");
    }

    /// <summary>
    /// Stores a trace. When the same file (same SHA-256) is already stored for the run, nothing is added and the result
    /// says so (a requested baseline is still set, on the stored copy).
    /// </summary>
    public HistoryAddResult Add(NewHistoryEntry entry)
    {
        ArgumentNullException.ThrowIfNull(entry);
        if (string.IsNullOrWhiteSpace(entry.RunId)) throw new InputException("the run id is empty; give --run with a name such as 'mast-feeder'");
        string sha = Sha256Hex(entry.OriginalBytes);
        string now = Format(entry.AddedUtc);
        return Write(() =>
        {
            var sameFile = new List<(long Id, string Run)>();
            using (var find = Command("SELECT id, run_id FROM traces WHERE sha256 = $sha ORDER BY id", ("$sha", sha)))
            using (var reader = find.ExecuteReader())
                while (reader.Read()) sameFile.Add((reader.GetInt64(0), reader.GetString(1)));
            var others = sameFile.Where(s => s.Run != entry.RunId).Select(s => s.Id).ToList();
            if (sameFile.FirstOrDefault(s => s.Run == entry.RunId) is { Id: > 0 } existing)
            {
                bool set = entry.MakeBaseline && CurrentBaselineId(entry.RunId) != existing.Id;
                if (set) InsertBaseline(entry.RunId, existing.Id, now);
                return new HistoryAddResult(existing.Id, AlreadyStored: true, set, others);
            }

            using var insert = Command("""
                INSERT INTO traces (run_id, added_utc, purpose, file_name, sha256, original, start_time_s, sample_interval_s,
                    sample_count, samples, metadata_json, settings_json, locate_json, note, passed, checked_against, check_json)
                VALUES ($run, $added, $purpose, $file, $sha, $original, $start, $dt, $count, $samples, $metadata, $settings,
                    $locate, $note, $passed, $against, $check)
                RETURNING id
                """,
                ("$run", entry.RunId), ("$added", now), ("$purpose", entry.Purpose == HistoryPurpose.Check ? "check" : "record"),
                ("$file", entry.FileName), ("$sha", sha), ("$original", entry.OriginalBytes),
                ("$start", entry.Trace.StartTimeSeconds), ("$dt", entry.Trace.SampleIntervalSeconds), ("$count", entry.Trace.Length),
                ("$samples", SampleBlob.Encode(entry.Trace.SamplesVolts)),
                ("$metadata", JsonSerializer.Serialize(entry.Trace.Metadata.OrderBy(p => p.Key, StringComparer.Ordinal).ToDictionary())),
                ("$settings", entry.SettingsJson), ("$locate", entry.LocateJson), ("$note", entry.Note),
                ("$passed", entry.Passed is bool p ? (p ? 1 : 0) : null), ("$against", entry.CheckedAgainstId), ("$check", entry.CheckJson));
            long id = (long)insert.ExecuteScalar()!;
            _options.InsideWriteTransaction?.Invoke();
            if (entry.MakeBaseline) InsertBaseline(entry.RunId, id, now);
            return new HistoryAddResult(id, AlreadyStored: false, entry.MakeBaseline, others);
        });
    }

    /// <summary>The id of the file with this SHA-256 stored for the run, or null (lets a caller skip slow work for a re-import).</summary>
    public long? FindInRun(string runId, string sha256) => Read(() =>
        Scalar("SELECT id FROM traces WHERE run_id = $run AND sha256 = $sha ORDER BY id LIMIT 1", ("$run", runId), ("$sha", sha256)) as long?);

    /// <summary>Every stored trace (of one run, or all runs), oldest first. Reads no samples, files or JSON.</summary>
    public IReadOnlyList<HistoryEntry> List(string? runId = null) => Read(() =>
    {
        using var command = Command($"""
            SELECT {EntryColumns} FROM traces t
            {(runId is null ? "" : "WHERE t.run_id = $run")}
            ORDER BY t.added_utc, t.id
            """, ("$run", runId));
        return ReadEntries(command);
    });

    /// <summary>The run's current baseline (the latest one set), or null when the run has none.</summary>
    public StoredTrace? CurrentBaseline(string runId) => Read(() => CurrentBaselineId(runId) is long id ? Get(id) : null);

    /// <summary>One stored trace in full, or null when there is no such id.</summary>
    public StoredTrace? Get(long id) => Read(() =>
    {
        using var command = Command($"""
            SELECT {EntryColumns}, t.original, t.start_time_s, t.sample_interval_s, t.samples, t.metadata_json, t.settings_json,
                t.locate_json, t.check_json
            FROM traces t WHERE t.id = $id
            """, ("$id", id));
        using var reader = command.ExecuteReader();
        if (!reader.Read()) return null;
        var entry = ReadEntry(reader);
        const int o = EntryColumnCount;
        var metadata = JsonSerializer.Deserialize<Dictionary<string, string>>(reader.GetString(o + 4)) ?? [];
        var trace = new Trace(reader.GetDouble(o + 1), reader.GetDouble(o + 2), SampleBlob.Decode((byte[])reader[o + 3]), metadata);
        return new StoredTrace(entry, (byte[])reader[o], trace, reader.GetString(o + 5),
            reader.IsDBNull(o + 6) ? null : reader.GetString(o + 6), reader.IsDBNull(o + 7) ? null : reader.GetString(o + 7));
    });

    /// <summary>SQLite's own consistency check ("ok" when sound) followed by our referential check.</summary>
    public IReadOnlyList<string> CheckIntegrity() => Read(() =>
    {
        var problems = new List<string>();
        using (var command = Command("PRAGMA integrity_check"))
        using (var reader = command.ExecuteReader())
            while (reader.Read()) if (reader.GetString(0) != "ok") problems.Add(reader.GetString(0));
        using (var command = Command("PRAGMA foreign_key_check"))
        using (var reader = command.ExecuteReader())
            while (reader.Read()) problems.Add($"table {reader.GetString(0)} row {reader.GetValue(1)} refers to a missing {reader.GetString(2)} row");
        return problems;
    });

    /// <summary>SHA-256 of a file's bytes, lower-case hex (FIPS 180-4).</summary>
    public static string Sha256Hex(byte[] bytes) => Convert.ToHexStringLower(SHA256.HashData(bytes));

    private const int EntryColumnCount = 12;
    private const string EntryColumns = """
        t.id, t.run_id, t.added_utc, t.purpose, t.file_name, t.sha256, t.sample_count, t.note, t.passed, t.checked_against,
        t.id IN (SELECT trace_id FROM baselines WHERE id IN (SELECT max(id) FROM baselines GROUP BY run_id)),
        EXISTS (SELECT 1 FROM baselines b WHERE b.trace_id = t.id)
        """;

    private static List<HistoryEntry> ReadEntries(SqliteCommand command)
    {
        var entries = new List<HistoryEntry>();
        using var reader = command.ExecuteReader();
        while (reader.Read()) entries.Add(ReadEntry(reader));
        return entries;
    }

    private static HistoryEntry ReadEntry(SqliteDataReader r) => new(
        r.GetInt64(0), r.GetString(1),
        DateTimeOffset.ParseExact(r.GetString(2), TimeFormat, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal),
        r.GetString(3) == "check" ? HistoryPurpose.Check : HistoryPurpose.Record,
        r.GetString(4), r.GetString(5), r.GetInt32(6),
        r.IsDBNull(7) ? null : r.GetString(7),
        r.IsDBNull(8) ? null : r.GetInt64(8) == 1,
        r.IsDBNull(9) ? null : r.GetInt64(9),
        r.GetInt64(10) == 1, r.GetInt64(11) == 1);

    private long? CurrentBaselineId(string runId) =>
        Scalar("SELECT trace_id FROM baselines WHERE run_id = $run ORDER BY id DESC LIMIT 1", ("$run", runId)) is long id ? id : null;

    private void InsertBaseline(string runId, long traceId, string now)
    {
        using var command = Command("INSERT INTO baselines (run_id, trace_id, set_utc) VALUES ($run, $trace, $now)",
            ("$run", runId), ("$trace", traceId), ("$now", now));
        command.ExecuteNonQuery();
    }

    private static string Format(DateTimeOffset time) => time.UtcDateTime.ToString(TimeFormat, CultureInfo.InvariantCulture);

    private T Write<T>(Func<T> work) => Guard(DatabasePath, () =>
    {
        // IMMEDIATE: take the write lock up front, so two writers queue instead of failing half-way.
        using var transaction = _connection.BeginTransaction(deferred: false);
        T result = work();
        transaction.Commit();
        return result;
    });

    private T Read<T>(Func<T> work) => Guard(DatabasePath, work);

    /// <summary>Turns the SQLite failures a user can act on into one-line <see cref="InputException"/>s.</summary>
    private static T Guard<T>(string path, Func<T> work)
    {
        try
        {
            return work();
        }
        catch (SqliteException e) when (e.SqliteErrorCode is 5 or 6) // SQLITE_BUSY, SQLITE_LOCKED
        {
            throw new InputException($"{path}: the history database is busy (another cablefault is writing to it); try again", e);
        }
        catch (SqliteException e) when (e.SqliteErrorCode is 11 or 26) // SQLITE_CORRUPT, SQLITE_NOTADB
        {
            throw new InputException($"{path}: the history database is damaged or not a database ({e.SqliteErrorCode switch { 11 => "malformed", _ => "not a database" }}); left untouched; restore it from a backup or give another --db", e);
        }
        catch (SqliteException e) when (e.SqliteErrorCode is 8 or 13 or 14 or 10) // READONLY, FULL, CANTOPEN, IOERR
        {
            string first = e.Message.Split('\n')[0].Trim();
            throw new InputException($"{path}: cannot use the history database ({first}); check the path, its permissions and free disk space", e);
        }
    }

    private SqliteCommand Command(string sql, params (string Name, object? Value)[] parameters)
    {
        var command = _connection.CreateCommand();
        command.CommandText = sql;
        foreach (var (name, value) in parameters) command.Parameters.AddWithValue(name, value ?? DBNull.Value);
        return command;
    }

    private object? Scalar(string sql, params (string Name, object? Value)[] parameters)
    {
        using var command = Command(sql, parameters);
        var value = command.ExecuteScalar();
        return value is DBNull ? null : value;
    }

    private void Execute(string sql)
    {
        using var command = Command(sql);
        command.ExecuteNonQuery();
    }

    /// <inheritdoc />
    public void Dispose() => _connection.Dispose();
}
