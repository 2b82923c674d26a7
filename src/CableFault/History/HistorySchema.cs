namespace CableFault.History;

/// <summary>
/// The database layout, versioned with <c>PRAGMA user_version</c>. Each migration takes the schema from version i to
/// i + 1 and runs inside the same transaction that bumps the version, so a half-applied migration cannot be seen.
/// <c>PRAGMA application_id</c> marks the file as ours, so a foreign SQLite file is recognised and left alone.
/// </summary>
internal static class HistorySchema
{
    /// <summary>Our application id ("CFhi" as a big-endian 32-bit integer).</summary>
    internal const int ApplicationId = 0x43466869;

    /// <summary>Migrations in order; index i takes version i to version i + 1.</summary>
    internal static readonly string[][] Migrations =
    [
        [
            """
            CREATE TABLE traces (
                id INTEGER PRIMARY KEY,
                run_id TEXT NOT NULL,
                added_utc TEXT NOT NULL,
                purpose TEXT NOT NULL CHECK (purpose IN ('record', 'check')),
                file_name TEXT NOT NULL,
                sha256 TEXT NOT NULL,
                original BLOB NOT NULL,
                start_time_s REAL NOT NULL,
                sample_interval_s REAL NOT NULL,
                sample_count INTEGER NOT NULL,
                samples BLOB NOT NULL,
                metadata_json TEXT NOT NULL,
                settings_json TEXT NOT NULL,
                locate_json TEXT,
                note TEXT,
                passed INTEGER CHECK (passed IN (0, 1)),
                checked_against INTEGER REFERENCES traces(id),
                check_json TEXT
            )
            """,
            "CREATE INDEX traces_run_time ON traces(run_id, added_utc)",
            "CREATE INDEX traces_time ON traces(added_utc)",
            "CREATE INDEX traces_sha256 ON traces(sha256)",
            """
            CREATE TABLE baselines (
                id INTEGER PRIMARY KEY,
                run_id TEXT NOT NULL,
                trace_id INTEGER NOT NULL REFERENCES traces(id),
                set_utc TEXT NOT NULL
            )
            """,
            "CREATE INDEX baselines_run ON baselines(run_id, id)",
            "CREATE INDEX baselines_trace ON baselines(trace_id)",
        ],
    ];

    /// <summary>The schema version this build writes.</summary>
    internal static int CurrentVersion => Migrations.Length;
}
