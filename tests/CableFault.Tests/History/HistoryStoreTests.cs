using CableFault.History;
using Microsoft.Data.Sqlite;

namespace CableFault.Tests.History;

/// <summary>The store on its own: round trips, baselines, re-imports, schema identity, foreign files, busy writers.</summary>
public class HistoryStoreTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("cf-history-").FullName;
    private string Db => Path.Combine(_folder, "history.db");

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void StoredTraceComesBackExactly()
    {
        var entry = HistoryFixtures.Entry("mast", seed: 3, note: "at handover");
        long id;
        using (var store = HistoryStore.Open(Db)) id = store.Add(entry).Id;
        using var reopened = HistoryStore.Open(Db);
        var stored = reopened.Get(id)!;
        Assert.Equal(entry.OriginalBytes, stored.OriginalBytes);
        Assert.Equal(entry.Trace.SamplesVolts.ToArray(), stored.Trace.SamplesVolts.ToArray()); // doubles stored bit for bit
        Assert.Equal(entry.Trace.StartTimeSeconds, stored.Trace.StartTimeSeconds);
        Assert.Equal(entry.Trace.SampleIntervalSeconds, stored.Trace.SampleIntervalSeconds);
        Assert.Equal("0.66", stored.Trace.MetadataOrNull("vf"));
        Assert.Equal("at handover", stored.Entry.Note);
        Assert.Equal(entry.AddedUtc, stored.Entry.AddedUtc);
        Assert.Equal(entry.LocateJson, stored.LocateJson);
        // Independent hash: the SHA-256 of the bytes computed here, not by the store (FIPS 180-4).
        Assert.Equal(Convert.ToHexStringLower(System.Security.Cryptography.SHA256.HashData(entry.OriginalBytes)), stored.Entry.Sha256);
        Assert.Null(reopened.Get(id + 1));
    }

    [Fact]
    public void SameFileTwiceInOneRunIsRecognisedAndNotStoredAgain()
    {
        using var store = HistoryStore.Open(Db);
        var first = store.Add(HistoryFixtures.Entry("mast", seed: 1));
        var again = store.Add(HistoryFixtures.Entry("mast", seed: 1) with { AddedUtc = DateTimeOffset.UnixEpoch, FileName = "renamed.csv" });
        Assert.False(first.AlreadyStored);
        Assert.True(again.AlreadyStored);
        Assert.Equal(first.Id, again.Id);
        Assert.Single(store.List());
        // The same bytes under another run are stored, with the other copy pointed out.
        var elsewhere = store.Add(HistoryFixtures.Entry("tower", seed: 1));
        Assert.False(elsewhere.AlreadyStored);
        Assert.Equal([first.Id], elsewhere.SameFileInOtherRuns);
    }

    [Fact]
    public void LatestBaselineIsCurrentAndEarlierOnesStayOnRecord()
    {
        using var store = HistoryStore.Open(Db);
        long a = store.Add(HistoryFixtures.Entry("mast", 1, baseline: true)).Id;
        long plain = store.Add(HistoryFixtures.Entry("mast", 2)).Id;
        long b = store.Add(HistoryFixtures.Entry("mast", 3, baseline: true)).Id;
        long other = store.Add(HistoryFixtures.Entry("tower", 4, baseline: true)).Id;
        Assert.Equal(b, store.CurrentBaseline("mast")!.Entry.Id);
        Assert.Equal(other, store.CurrentBaseline("tower")!.Entry.Id);
        Assert.Null(store.CurrentBaseline("nowhere"));
        var byId = store.List().ToDictionary(e => e.Id);
        Assert.True(byId[a].WasBaseline && !byId[a].IsCurrentBaseline);
        Assert.True(byId[b].WasBaseline && byId[b].IsCurrentBaseline);
        Assert.False(byId[plain].WasBaseline);
        // Re-importing the first baseline with --baseline makes it current again without a new row.
        var again = store.Add(HistoryFixtures.Entry("mast", 1, baseline: true));
        Assert.True(again.AlreadyStored && again.BaselineSet);
        Assert.Equal(a, store.CurrentBaseline("mast")!.Entry.Id);
    }

    [Fact]
    public void ListIsOldestFirstAndFiltersByRun()
    {
        using var store = HistoryStore.Open(Db);
        var t0 = new DateTimeOffset(2026, 1, 1, 0, 0, 0, TimeSpan.Zero);
        store.Add(HistoryFixtures.Entry("mast", 1, at: t0.AddDays(2)));
        store.Add(HistoryFixtures.Entry("tower", 2, at: t0.AddDays(1)));
        store.Add(HistoryFixtures.Entry("mast", 3, at: t0));
        Assert.Equal(["capture-3.csv", "capture-2.csv", "capture-1.csv"], store.List().Select(e => e.FileName));
        Assert.Equal(["capture-3.csv", "capture-1.csv"], store.List("mast").Select(e => e.FileName));
        Assert.Empty(store.List("nowhere"));
    }

    [Fact]
    public void NewDatabaseCarriesOurIdentityWalAndIndexes()
    {
        using (var store = HistoryStore.Open(Db)) store.Add(HistoryFixtures.Entry("mast", 1));
        using var raw = new SqliteConnection($"Data Source={Db};Pooling=False");
        raw.Open();
        Assert.Equal(1L, Scalar(raw, "PRAGMA user_version"));
        Assert.Equal(0x43466869L, Scalar(raw, "PRAGMA application_id"));
        Assert.Equal("wal", Scalar(raw, "PRAGMA journal_mode"));
        var indexes = new List<string>();
        using (var command = new SqliteCommand("SELECT name FROM sqlite_master WHERE type = 'index'", raw))
        using (var reader = command.ExecuteReader())
            while (reader.Read()) indexes.Add(reader.GetString(0));
        Assert.Contains("traces_run_time", indexes);
        Assert.Contains("traces_time", indexes);
        // The list query of one run must use the run index, not scan the table (SQLite query planner).
        string plan = string.Join(" ", Rows(raw, "EXPLAIN QUERY PLAN SELECT id FROM traces WHERE run_id = 'mast' ORDER BY added_utc"));
        Assert.Contains("traces_run_time", plan);
    }

    [Fact]
    public void NonSqliteFileIsRejectedInOneLineAndLeftUntouched()
    {
        byte[] content = "time_ns,volts\n0,0.5\n"u8.ToArray();
        File.WriteAllBytes(Db, content);
        var e = Assert.Throws<InputException>(() => HistoryStore.Open(Db));
        Assert.Contains("not an SQLite file", e.Message);
        Assert.DoesNotContain('\n', e.Message);
        Assert.Equal(content, File.ReadAllBytes(Db));
        Assert.Equal(["history.db"], Directory.GetFiles(_folder).Select(Path.GetFileName));
    }

    [Fact]
    public void ForeignSqliteDatabaseIsRejectedAndLeftUntouched()
    {
        using (var raw = new SqliteConnection($"Data Source={Db};Pooling=False"))
        {
            raw.Open();
            Exec(raw, "CREATE TABLE contacts (name TEXT)");
        }
        byte[] before = File.ReadAllBytes(Db);
        var e = Assert.Throws<InputException>(() => HistoryStore.Open(Db));
        Assert.Contains("not a CableFault history", e.Message);
        Assert.Equal(before, File.ReadAllBytes(Db));
        Assert.False(File.Exists(Db + "-wal"));
    }

    [Fact]
    public void SqliteHeaderWithGarbageAfterItIsReportedNotCrashed()
    {
        var bytes = new byte[8192];
        "SQLite format 3\0"u8.CopyTo(bytes);
        new Random(7).NextBytes(bytes.AsSpan(16));
        File.WriteAllBytes(Db, bytes);
        var e = Assert.Throws<InputException>(() => HistoryStore.Open(Db));
        Assert.Contains(Db, e.Message);
        Assert.Equal(bytes, File.ReadAllBytes(Db));
    }

    [Fact]
    public void SchemaFromANewerVersionIsRefused()
    {
        using (var store = HistoryStore.Open(Db)) { }
        using (var raw = new SqliteConnection($"Data Source={Db};Pooling=False"))
        {
            raw.Open();
            Exec(raw, "PRAGMA user_version = 99");
        }
        var e = Assert.Throws<InputException>(() => HistoryStore.Open(Db));
        Assert.Contains("newer CableFault", e.Message);
    }

    [Fact]
    public void MissingDatabaseIsNotCreatedByReaders()
    {
        var e = Assert.Throws<InputException>(() => HistoryStore.Open(Db, new HistoryStoreOptions { CreateIfMissing = false }));
        Assert.Contains("no history database", e.Message);
        Assert.False(File.Exists(Db));
    }

    [Fact]
    public void WriterBlockedBeyondTheBusyTimeoutGetsBusyTryAgain()
    {
        using (HistoryStore.Open(Db)) { }
        using var holder = new SqliteConnection($"Data Source={Db};Pooling=False");
        holder.Open();
        using var hold = holder.BeginTransaction(deferred: false); // another writer holds the write lock
        using var store = HistoryStore.Open(Db, new HistoryStoreOptions { BusyTimeoutMilliseconds = 50 });
        var e = Assert.Throws<InputException>(() => store.Add(HistoryFixtures.Entry("mast", 1)));
        Assert.Contains("busy", e.Message);
        Assert.Contains("try again", e.Message);
        hold.Rollback();
        Assert.False(store.Add(HistoryFixtures.Entry("mast", 1)).AlreadyStored); // nothing half-written by the failed try
    }

    [Fact]
    public void TwoWritersAtOnceBothSucceed()
    {
        using (HistoryStore.Open(Db)) { }
        const int perWriter = 20;
        var entries = Enumerable.Range(0, 2 * perWriter).Select(i => HistoryFixtures.Entry(i % 2 == 0 ? "mast" : "tower", i)).ToArray();
        Parallel.For(0, 2, new ParallelOptions { MaxDegreeOfParallelism = 2 }, writer =>
        {
            using var store = HistoryStore.Open(Db); // its own connection, as a second process would have
            for (int i = writer; i < entries.Length; i += 2) store.Add(entries[i]);
        });
        using var check = HistoryStore.Open(Db);
        Assert.Equal(perWriter, check.List("mast").Count);
        Assert.Equal(perWriter, check.List("tower").Count);
        Assert.Empty(check.CheckIntegrity());
    }

    private static object? Scalar(SqliteConnection c, string sql)
    {
        using var command = new SqliteCommand(sql, c);
        return command.ExecuteScalar();
    }

    private static void Exec(SqliteConnection c, string sql)
    {
        using var command = new SqliteCommand(sql, c);
        command.ExecuteNonQuery();
    }

    private static List<string> Rows(SqliteConnection c, string sql)
    {
        var rows = new List<string>();
        using var command = new SqliteCommand(sql, c);
        using var reader = command.ExecuteReader();
        while (reader.Read()) rows.Add(string.Join(" ", Enumerable.Range(0, reader.FieldCount).Select(i => reader.GetValue(i)?.ToString())));
        return rows;
    }
}
