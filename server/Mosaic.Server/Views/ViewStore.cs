using System.Globalization;
using System.Security.Cryptography;
using Microsoft.Data.Sqlite;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Views;

/// <summary>
/// Saved views in SQLite at &lt;state dir&gt;/views.db: one table, WAL mode (readers never wait for a writer), every
/// statement parameterised. A connection per call from the driver's pool, so concurrent requests are safe; writers
/// that meet a lock wait for it (busy timeout) rather than fail.
/// </summary>
public sealed class ViewStore
{
    public const string FileName = "views.db";

    /// <summary>Most views one listing returns.</summary>
    public const int ListLimit = 500;

    private const string TimeFormat = "yyyy-MM-dd'T'HH:mm:ss.fff'Z'";

    private readonly string _connectionString;

    public ViewStore(MosaicOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        Directory.CreateDirectory(options.StateDirectory);
        DatabasePath = Path.Combine(options.StateDirectory, FileName);
        _connectionString = new SqliteConnectionStringBuilder
        {
            DataSource = DatabasePath,
            Mode = SqliteOpenMode.ReadWriteCreate,
            Cache = SqliteCacheMode.Private,
            Pooling = true,
            DefaultTimeout = 30,
        }.ToString();
        using var connection = Open();
        // journal_mode = WAL is kept in the database file itself; the rest is per connection (see Open).
        Execute(connection, "PRAGMA journal_mode = WAL;");
        Execute(connection, """
            CREATE TABLE IF NOT EXISTS views (
                id         TEXT PRIMARY KEY NOT NULL,
                field      TEXT NOT NULL,
                title      TEXT,
                note       TEXT,
                created    TEXT NOT NULL,
                state      TEXT NOT NULL,
                key_sha256 BLOB NOT NULL
            ) STRICT;
            CREATE INDEX IF NOT EXISTS views_by_field ON views (field, created DESC);
            """);
    }

    public string DatabasePath { get; }

    /// <summary>Stores a new view under a fresh id; returns it with its delete key (which only the caller ever sees).</summary>
    public (SavedView View, string DeleteKey) Add(string field, string? title, string? note, IReadOnlyList<KeyValuePair<string, string>> state)
    {
        ArgumentException.ThrowIfNullOrEmpty(field);
        ArgumentNullException.ThrowIfNull(state);
        var key = ViewTokens.NewDeleteKey();
        // Millisecond precision is what is stored, so the answer shows the same instant a later read does.
        var created = DateTimeOffset.FromUnixTimeMilliseconds(DateTimeOffset.UtcNow.ToUnixTimeMilliseconds());
        using var connection = Open();
        for (var attempt = 0; ; attempt++)
        {
            var id = ViewTokens.NewId();
            using var insert = connection.CreateCommand();
            insert.CommandText = """
                INSERT INTO views (id, field, title, note, created, state, key_sha256)
                VALUES ($id, $field, $title, $note, $created, $state, $key);
                """;
            insert.Parameters.AddWithValue("$id", id);
            insert.Parameters.AddWithValue("$field", field);
            insert.Parameters.AddWithValue("$title", (object?)title ?? DBNull.Value);
            insert.Parameters.AddWithValue("$note", (object?)note ?? DBNull.Value);
            insert.Parameters.AddWithValue("$created", created.UtcDateTime.ToString(TimeFormat, CultureInfo.InvariantCulture));
            insert.Parameters.AddWithValue("$state", ViewState.ToJson(state));
            insert.Parameters.AddWithValue("$key", ViewTokens.Hash(key));
            try
            {
                insert.ExecuteNonQuery();
                return (new SavedView(id, field, title, note, created, state), key);
            }
            catch (SqliteException e) when (e.SqliteErrorCode == 19 && attempt < 3)
            {
                // SQLITE_CONSTRAINT on the primary key: a 72-bit id collided; draw another.
            }
        }
    }

    public SavedView? Find(string id)
    {
        if (!ViewTokens.IsWellFormedId(id)) return null;
        using var connection = Open();
        using var query = connection.CreateCommand();
        query.CommandText = "SELECT id, field, title, note, created, state FROM views WHERE id = $id;";
        query.Parameters.AddWithValue("$id", id);
        using var reader = query.ExecuteReader();
        return reader.Read() ? Read(reader) : null;
    }

    /// <summary>The field's views, newest first, at most <see cref="ListLimit"/>.</summary>
    public IReadOnlyList<SavedView> ListByField(string field)
    {
        using var connection = Open();
        using var query = connection.CreateCommand();
        query.CommandText = """
            SELECT id, field, title, note, created, state FROM views
            WHERE field = $field ORDER BY created DESC, rowid DESC LIMIT $limit;
            """;
        query.Parameters.AddWithValue("$field", field);
        query.Parameters.AddWithValue("$limit", ListLimit);
        using var reader = query.ExecuteReader();
        var views = new List<SavedView>();
        while (reader.Read()) views.Add(Read(reader));
        return views;
    }

    /// <summary>Deletes the view where the key is its own.</summary>
    public DeleteOutcome Delete(string id, string? deleteKey)
    {
        if (!ViewTokens.IsWellFormedId(id)) return DeleteOutcome.NotFound;
        using var connection = Open();
        using var transaction = connection.BeginTransaction(deferred: false);
        byte[] stored;
        using (var query = connection.CreateCommand())
        {
            query.Transaction = transaction;
            query.CommandText = "SELECT key_sha256 FROM views WHERE id = $id;";
            query.Parameters.AddWithValue("$id", id);
            if (query.ExecuteScalar() is not byte[] hash) return DeleteOutcome.NotFound;
            stored = hash;
        }
        if (string.IsNullOrEmpty(deleteKey) || !CryptographicOperations.FixedTimeEquals(stored, ViewTokens.Hash(deleteKey)))
            return DeleteOutcome.WrongKey;
        using (var delete = connection.CreateCommand())
        {
            delete.Transaction = transaction;
            delete.CommandText = "DELETE FROM views WHERE id = $id;";
            delete.Parameters.AddWithValue("$id", id);
            delete.ExecuteNonQuery();
        }
        transaction.Commit();
        return DeleteOutcome.Deleted;
    }

    private SqliteConnection Open()
    {
        var connection = new SqliteConnection(_connectionString);
        connection.Open();
        // FULL: in WAL mode each commit is synced to disk before it returns, so a 201 survives a kill -9 and a power
        // loss; NORMAL survives a crash of the process but may lose the last commits on power loss (sqlite.org,
        // "PRAGMA synchronous"). One fsync per save is cheap beside how rarely views are saved.
        Execute(connection, "PRAGMA busy_timeout = 10000; PRAGMA synchronous = FULL;");
        return connection;
    }

    private static void Execute(SqliteConnection connection, string sql)
    {
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    private static SavedView Read(SqliteDataReader reader) => new(
        reader.GetString(0),
        reader.GetString(1),
        reader.IsDBNull(2) ? null : reader.GetString(2),
        reader.IsDBNull(3) ? null : reader.GetString(3),
        DateTimeOffset.ParseExact(reader.GetString(4), TimeFormat, CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal),
        ViewState.FromJson(reader.GetString(5)));
}
