using System.Globalization;
using Microsoft.Data.Sqlite;

namespace LoopShaper.Library;

/// <summary>
/// The library's tables and their migrations. schema_version holds one row per applied migration; a library made by
/// a newer program (a higher version than <see cref="CurrentVersion"/>) is refused rather than guessed at.
/// </summary>
internal static class LibrarySchema
{
    /// <summary>The schema version this program writes.</summary>
    public const int CurrentVersion = 1;

    /// <summary>Migration n takes the schema from version n - 1 to n; index 0 is version 1.</summary>
    private static readonly string[] Migrations =
    [
        """
        CREATE TABLE designs (
          id INTEGER PRIMARY KEY,
          name TEXT NOT NULL,
          created_utc TEXT NOT NULL);
        CREATE TABLE branches (
          id INTEGER PRIMARY KEY,
          design INTEGER NOT NULL REFERENCES designs(id),
          name TEXT NOT NULL,
          forked_from INTEGER REFERENCES revisions(id),
          created_utc TEXT NOT NULL,
          UNIQUE (design, name));
        CREATE TABLE revisions (
          id INTEGER PRIMARY KEY,
          design INTEGER NOT NULL REFERENCES designs(id),
          branch INTEGER NOT NULL REFERENCES branches(id),
          parent INTEGER REFERENCES revisions(id),
          author TEXT NOT NULL,
          message TEXT NOT NULL,
          created_utc TEXT NOT NULL,
          design_name TEXT NOT NULL,
          description TEXT NOT NULL,
          content TEXT NOT NULL,
          sha256 TEXT NOT NULL,
          restored_from INTEGER REFERENCES revisions(id),
          UNIQUE (branch, parent));
        CREATE INDEX revisions_by_design ON revisions (design, id);
        CREATE TABLE tags (
          design INTEGER NOT NULL REFERENCES designs(id),
          tag TEXT NOT NULL COLLATE NOCASE,
          PRIMARY KEY (design, tag));
        CREATE TRIGGER revisions_never_change BEFORE UPDATE ON revisions
          BEGIN SELECT RAISE(ABORT, 'revisions are append-only: a saved revision is never changed'); END;
        CREATE TRIGGER revisions_never_go BEFORE DELETE ON revisions
          BEGIN SELECT RAISE(ABORT, 'revisions are append-only: a saved revision is never deleted'); END;
        CREATE TRIGGER branches_never_change BEFORE UPDATE ON branches
          BEGIN SELECT RAISE(ABORT, 'branches are append-only'); END;
        CREATE TRIGGER branches_never_go BEFORE DELETE ON branches
          BEGIN SELECT RAISE(ABORT, 'branches are append-only'); END;
        CREATE TRIGGER designs_never_go BEFORE DELETE ON designs
          BEGIN SELECT RAISE(ABORT, 'designs are append-only: never deleted from the library'); END;
        """,
    ];

    /// <summary>Creates the schema or brings it up to <see cref="CurrentVersion"/>, each migration in one transaction.</summary>
    public static void Migrate(SqliteConnection connection)
    {
        using (var create = connection.CreateCommand())
        {
            create.CommandText = "CREATE TABLE IF NOT EXISTS schema_version (version INTEGER PRIMARY KEY, applied_utc TEXT NOT NULL);";
            create.ExecuteNonQuery();
        }

        using var tx = connection.BeginTransaction();
        int version = VersionOf(connection, tx);
        if (version > CurrentVersion)
        {
            throw new InvalidOperationException($"The library has schema version {version}; this program knows versions up to {CurrentVersion}. Open it with a newer LoopShaper.");
        }

        for (int v = version + 1; v <= CurrentVersion; v++)
        {
            using var step = connection.CreateCommand();
            step.Transaction = tx;
            step.CommandText = Migrations[v - 1];
            step.ExecuteNonQuery();
            using var mark = connection.CreateCommand();
            mark.Transaction = tx;
            mark.CommandText = "INSERT INTO schema_version (version, applied_utc) VALUES ($v, $t);";
            mark.Parameters.AddWithValue("$v", v);
            mark.Parameters.AddWithValue("$t", DateTime.UtcNow.ToString("O", CultureInfo.InvariantCulture));
            mark.ExecuteNonQuery();
        }

        tx.Commit();
    }

    /// <summary>The highest applied migration, 0 for a new file.</summary>
    public static int VersionOf(SqliteConnection connection, SqliteTransaction? tx = null)
    {
        using var q = connection.CreateCommand();
        q.Transaction = tx;
        q.CommandText = "SELECT COALESCE(MAX(version), 0) FROM schema_version;";
        return Convert.ToInt32(q.ExecuteScalar(), CultureInfo.InvariantCulture);
    }
}
