using System.Collections.Immutable;
using System.Globalization;
using LoopShaper.Core.Design;
using Microsoft.Data.Sqlite;

namespace LoopShaper.Library;

/// <summary>
/// The design library: an embedded SQLite file of designs, their branches and their revisions (docs/library.md).
/// Every save appends one revision in one transaction; nothing is ever overwritten or deleted (triggers refuse it).
/// A save names the revision it was based on: when the branch has moved on since, the save is a conflict and writes
/// nothing, and the caller may save as a new branch instead. Safe to use from several threads and processes: each
/// call opens its own connection and writes take SQLite's write lock before they read the branch head.
/// </summary>
public sealed class DesignLibrary : IDisposable
{
    /// <summary>Name of a design's first branch.</summary>
    public const string MainBranch = "main";

    /// <summary>Longest library name, branch name, tag and author.</summary>
    public const int MaxNameLength = 200;

    /// <summary>Longest commit message.</summary>
    public const int MaxMessageLength = 4000;

    private readonly string _connectionString;

    private DesignLibrary(string path)
    {
        Path = path;
        _connectionString = new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Mode = SqliteOpenMode.ReadWriteCreate,
            Cache = SqliteCacheMode.Private,
            Pooling = true,
            // Seconds a command waits for another writer's lock before it gives up.
            DefaultTimeout = 30,
        }.ToString();
    }

    /// <summary>The library file, absolute.</summary>
    public string Path { get; }

    /// <summary>
    /// Opens (or creates) the library at <paramref name="path"/>, creating its folder, switching the file to
    /// write-ahead logging and applying any missing schema migration.
    /// </summary>
    /// <exception cref="InvalidOperationException">The file is a library of a newer schema, or cannot be put in WAL mode.</exception>
    /// <exception cref="SqliteException">The file cannot be opened or is not a SQLite database.</exception>
    public static DesignLibrary Open(string path)
    {
        string full = System.IO.Path.GetFullPath(path);
        string? folder = System.IO.Path.GetDirectoryName(full);
        if (!string.IsNullOrEmpty(folder))
        {
            Directory.CreateDirectory(folder);
        }

        var library = new DesignLibrary(full);
        using var c = library.Connect();
        // WAL is a property of the file and stays once set: readers never block the writer and a commit is one append
        // to the log, so a process killed mid-save leaves every committed transaction intact (sqlite.org/wal.html).
        string mode = Convert.ToString(Scalar(c, null, "PRAGMA journal_mode=WAL;"), CultureInfo.InvariantCulture) ?? string.Empty;
        if (!string.Equals(mode, "wal", StringComparison.OrdinalIgnoreCase))
        {
            throw new InvalidOperationException($"The library {full} could not be switched to write-ahead logging (journal mode is '{mode}').");
        }

        LibrarySchema.Migrate(c);
        return library;
    }

    /// <summary>The schema version of the open file.</summary>
    public int SchemaVersion
    {
        get
        {
            using var c = Connect();
            return LibrarySchema.VersionOf(c);
        }
    }

    /// <summary>Saves a design that is not in the library yet: a new design with a "main" branch and its first revision.</summary>
    public SaveResult AddDesign(string libraryName, LoopDesign design, IEnumerable<string> tags, string author, string message)
    {
        string name = (libraryName ?? string.Empty).Trim();
        if (Refuse(name, author, message) is string why)
        {
            return SaveResult.Rejected(why);
        }

        if (NormalizeTags(tags, out var tagList) is string badTag)
        {
            return SaveResult.Rejected(badTag);
        }

        if (!TryWrite(design, out string content, out string? error))
        {
            return SaveResult.Rejected(error!);
        }

        using var c = Connect();
        using var tx = c.BeginTransaction();
        string now = Now();
        long designId = Insert(c, tx, "INSERT INTO designs (name, created_utc) VALUES ($n, $t) RETURNING id;", ("$n", name), ("$t", now));
        long branchId = Insert(c, tx, "INSERT INTO branches (design, name, forked_from, created_utc) VALUES ($d, $n, NULL, $t) RETURNING id;", ("$d", designId), ("$n", MainBranch), ("$t", now));
        foreach (string tag in tagList)
        {
            Execute(c, tx, "INSERT OR IGNORE INTO tags (design, tag) VALUES ($d, $g);", ("$d", designId), ("$g", tag));
        }

        long id = Append(c, tx, designId, branchId, null, author, message, design, content, null, now);
        tx.Commit();
        return SaveResult.Saved(RevisionOf(c, null, id)!);
    }

    /// <summary>
    /// Appends a revision to the branch of <paramref name="basedOnRevisionId"/>, only if that revision is still the
    /// branch's head; otherwise returns a conflict and writes nothing.
    /// </summary>
    public SaveResult Save(long basedOnRevisionId, LoopDesign design, string author, string message)
    {
        if (Refuse(null, author, message) is string why)
        {
            return SaveResult.Rejected(why);
        }

        if (!TryWrite(design, out string content, out string? error))
        {
            return SaveResult.Rejected(error!);
        }

        return OnHead(basedOnRevisionId, (c, tx, basis) => Append(c, tx, basis.DesignId, basis.BranchId, basis.Id, author, message, design, content, null, Now()));
    }

    /// <summary>Starts a new branch at <paramref name="basedOnRevisionId"/> (any revision, head or not) with this design as its first revision.</summary>
    public SaveResult SaveAsBranch(long basedOnRevisionId, string branchName, LoopDesign design, string author, string message)
    {
        string name = (branchName ?? string.Empty).Trim();
        if (Refuse(null, author, message) is string why)
        {
            return SaveResult.Rejected(why);
        }

        if (name.Length is 0 or > MaxNameLength)
        {
            return SaveResult.Rejected($"branch name: '{name}' has {name.Length} characters; give 1 to {MaxNameLength}.");
        }

        if (!TryWrite(design, out string content, out string? error))
        {
            return SaveResult.Rejected(error!);
        }

        using var c = Connect();
        using var tx = c.BeginTransaction();
        if (RevisionOf(c, tx, basedOnRevisionId) is not RevisionInfo basis)
        {
            return SaveResult.Rejected($"revision {basedOnRevisionId} is not in the library.");
        }

        if (Scalar(c, tx, "SELECT 1 FROM branches WHERE design = $d AND name = $n;", ("$d", basis.DesignId), ("$n", name)) is not null)
        {
            return SaveResult.Rejected($"branch name: the design already has a branch '{name}'; choose another name.");
        }

        string now = Now();
        long branchId = Insert(c, tx, "INSERT INTO branches (design, name, forked_from, created_utc) VALUES ($d, $n, $f, $t) RETURNING id;", ("$d", basis.DesignId), ("$n", name), ("$f", basis.Id), ("$t", now));
        long id = Append(c, tx, basis.DesignId, branchId, basis.Id, author, message, design, content, null, now);
        tx.Commit();
        return SaveResult.Saved(RevisionOf(c, null, id)!);
    }

    /// <summary>
    /// Restores <paramref name="revisionId"/>: appends to the branch of <paramref name="basedOnRevisionId"/> a new
    /// revision whose content is the old one's text, character for character. History keeps both. A conflict when
    /// the base is no longer its branch's head.
    /// </summary>
    public SaveResult Restore(long revisionId, long basedOnRevisionId, string author)
    {
        if (Refuse(null, author, string.Empty) is string why)
        {
            return SaveResult.Rejected(why);
        }

        using (var probe = Connect())
        {
            if (RevisionOf(probe, null, revisionId) is not RevisionInfo old || RevisionOf(probe, null, basedOnRevisionId) is not RevisionInfo basis)
            {
                return SaveResult.Rejected($"revision {revisionId} or {basedOnRevisionId} is not in the library.");
            }

            if (old.DesignId != basis.DesignId)
            {
                return SaveResult.Rejected($"revision {revisionId} belongs to another design than revision {basedOnRevisionId}: open it and save it as a new design instead.");
            }
        }

        return OnHead(basedOnRevisionId, (c, tx, basis) =>
        {
            string content = Convert.ToString(Scalar(c, tx, "SELECT content FROM revisions WHERE id = $id;", ("$id", revisionId)), CultureInfo.InvariantCulture)!;
            var design = DesignFile.Read(content).Design
                ?? throw new InvalidOperationException($"revision {revisionId} cannot be read as a design file.");
            return Append(c, tx, basis.DesignId, basis.BranchId, basis.Id, author, $"restored revision {revisionId}", design, content, revisionId, Now());
        });
    }

    /// <summary>Replaces a design's tags.</summary>
    /// <returns>Null when done; otherwise why nothing was changed.</returns>
    public string? SetTags(long designId, IEnumerable<string> tags)
    {
        if (NormalizeTags(tags, out var tagList) is string bad)
        {
            return bad;
        }

        using var c = Connect();
        using var tx = c.BeginTransaction();
        if (Scalar(c, tx, "SELECT 1 FROM designs WHERE id = $d;", ("$d", designId)) is null)
        {
            return $"design {designId} is not in the library.";
        }

        Execute(c, tx, "DELETE FROM tags WHERE design = $d;", ("$d", designId));
        foreach (string tag in tagList)
        {
            Execute(c, tx, "INSERT OR IGNORE INTO tags (design, tag) VALUES ($d, $g);", ("$d", designId), ("$g", tag));
        }

        tx.Commit();
        return null;
    }

    /// <summary>
    /// Designs whose library name, tags, or any revision's design name, description or message contain every word of
    /// <paramref name="text"/> (case-insensitive for ASCII letters); all designs for empty text. Newest activity first.
    /// </summary>
    public ImmutableArray<DesignSummary> Search(string? text)
    {
        var words = (text ?? string.Empty).Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        using var c = Connect();
        using var q = c.CreateCommand();
        var where = new List<string>();
        for (int i = 0; i < words.Length; i++)
        {
            string p = "$w" + i.ToString(CultureInfo.InvariantCulture);
            q.Parameters.AddWithValue(p, "%" + EscapeLike(words[i]) + "%");
            where.Add($"(d.name LIKE {p} ESCAPE '\\' OR EXISTS (SELECT 1 FROM tags t WHERE t.design = d.id AND t.tag LIKE {p} ESCAPE '\\')"
                + $" OR EXISTS (SELECT 1 FROM revisions r WHERE r.design = d.id AND (r.design_name LIKE {p} ESCAPE '\\' OR r.description LIKE {p} ESCAPE '\\' OR r.message LIKE {p} ESCAPE '\\')))");
        }

        q.CommandText = "SELECT d.id FROM designs d" + (where.Count > 0 ? " WHERE " + string.Join(" AND ", where) : string.Empty)
            + " ORDER BY (SELECT MAX(r.id) FROM revisions r WHERE r.design = d.id) DESC;";
        var ids = new List<long>();
        using (var r = q.ExecuteReader())
        {
            while (r.Read())
            {
                ids.Add(r.GetInt64(0));
            }
        }

        return [.. ids.Select(id => SummaryOf(c, id)).OfType<DesignSummary>()];
    }

    /// <summary>One design's summary, or null when there is no such design.</summary>
    public DesignSummary? Design(long designId)
    {
        using var c = Connect();
        return SummaryOf(c, designId);
    }

    /// <summary>Every revision of a design over all its branches, newest first.</summary>
    public ImmutableArray<RevisionInfo> History(long designId)
    {
        using var c = Connect();
        return Revisions(c, null, "WHERE r.design = $d ORDER BY r.id DESC", ("$d", designId));
    }

    /// <summary>A design's branches, oldest first, each with its head.</summary>
    public ImmutableArray<BranchInfo> Branches(long designId)
    {
        using var c = Connect();
        using var q = Command(c, null, "SELECT b.id, b.design, b.name, b.forked_from, b.created_utc, (SELECT MAX(r.id) FROM revisions r WHERE r.branch = b.id) FROM branches b WHERE b.design = $d ORDER BY b.id;", ("$d", designId));
        using var r = q.ExecuteReader();
        var list = new List<BranchInfo>();
        while (r.Read())
        {
            list.Add(new BranchInfo(r.GetInt64(0), r.GetInt64(1), r.GetString(2), r.IsDBNull(3) ? null : r.GetInt64(3), ParseUtc(r.GetString(4)), r.GetInt64(5)));
        }

        return [.. list];
    }

    /// <summary>The head of the branch a revision is on.</summary>
    public RevisionInfo? HeadOfBranchOf(long revisionId)
    {
        using var c = Connect();
        return RevisionOf(c, null, revisionId) is RevisionInfo r ? HeadOf(c, null, r.BranchId) : null;
    }

    /// <summary>A revision and its content, or null when there is no such revision.</summary>
    public StoredRevision? Read(long revisionId)
    {
        using var c = Connect();
        if (RevisionOf(c, null, revisionId) is not RevisionInfo info)
        {
            return null;
        }

        string content = Convert.ToString(Scalar(c, null, "SELECT content FROM revisions WHERE id = $id;", ("$id", revisionId)), CultureInfo.InvariantCulture)!;
        return new StoredRevision(info, content);
    }

    /// <summary>Returns this file's pooled connections, so that the file can be moved or deleted.</summary>
    public void Dispose()
    {
        using var c = new SqliteConnection(_connectionString);
        SqliteConnection.ClearPool(c);
    }

    /// <summary>
    /// A connection with foreign keys on and synchronous=FULL: in WAL mode NORMAL already survives a killed process,
    /// FULL also syncs the log at every commit so that a saved revision survives a power cut or an OS crash too
    /// (sqlite.org/pragma.html#pragma_synchronous). A save is rare and small; the extra fsync costs nothing visible.
    /// </summary>
    private SqliteConnection Connect()
    {
        var c = new SqliteConnection(_connectionString);
        c.Open();
        Execute(c, null, "PRAGMA foreign_keys = ON; PRAGMA synchronous = FULL;");
        return c;
    }

    private delegate long Appender(SqliteConnection c, SqliteTransaction tx, RevisionInfo basis);

    /// <summary>Runs an append inside one write transaction, only when the base revision is still its branch's head.</summary>
    private SaveResult OnHead(long basedOnRevisionId, Appender append)
    {
        using var c = Connect();
        // BEGIN IMMEDIATE (Microsoft.Data.Sqlite's default): the write lock is taken before the head is read, so no
        // other save can slip in between the check and the append.
        using var tx = c.BeginTransaction();
        if (RevisionOf(c, tx, basedOnRevisionId) is not RevisionInfo basis)
        {
            return SaveResult.Rejected($"revision {basedOnRevisionId} is not in the library.");
        }

        var head = HeadOf(c, tx, basis.BranchId)!;
        if (head.Id != basis.Id)
        {
            return SaveResult.Conflict(head, basis.Id);
        }

        long id = append(c, tx, basis);
        tx.Commit();
        return SaveResult.Saved(RevisionOf(c, null, id)!);
    }

    private static long Append(SqliteConnection c, SqliteTransaction tx, long designId, long branchId, long? parentId, string author, string message, LoopDesign design, string content, long? restoredFrom, string now)
        => Insert(c, tx, """
            INSERT INTO revisions (design, branch, parent, author, message, created_utc, design_name, description, content, sha256, restored_from)
            VALUES ($d, $b, $p, $a, $m, $t, $n, $x, $c, $h, $r) RETURNING id;
            """,
            ("$d", designId), ("$b", branchId), ("$p", parentId), ("$a", (author ?? string.Empty).Trim()), ("$m", (message ?? string.Empty).Trim()), ("$t", now),
            ("$n", design.Name), ("$x", design.Description), ("$c", content), ("$h", RevisionHash.Of(content)), ("$r", restoredFrom));

    private static DesignSummary? SummaryOf(SqliteConnection c, long designId)
    {
        using var q = Command(c, null, "SELECT name, created_utc, (SELECT COUNT(*) FROM revisions r WHERE r.design = d.id), (SELECT MAX(r.id) FROM revisions r WHERE r.design = d.id) FROM designs d WHERE d.id = $d;", ("$d", designId));
        string name;
        DateTime created;
        int count;
        long latest;
        using (var r = q.ExecuteReader())
        {
            if (!r.Read())
            {
                return null;
            }

            (name, created, count, latest) = (r.GetString(0), ParseUtc(r.GetString(1)), r.GetInt32(2), r.GetInt64(3));
        }

        var tags = new List<string>();
        using (var t = Command(c, null, "SELECT tag FROM tags WHERE design = $d ORDER BY tag COLLATE NOCASE;", ("$d", designId)))
        using (var r = t.ExecuteReader())
        {
            while (r.Read())
            {
                tags.Add(r.GetString(0));
            }
        }

        return new DesignSummary(designId, name, created, [.. tags], count, RevisionOf(c, null, latest)!);
    }

    private static RevisionInfo? RevisionOf(SqliteConnection c, SqliteTransaction? tx, long id)
    {
        var list = Revisions(c, tx, "WHERE r.id = $id", ("$id", id));
        return list.IsEmpty ? null : list[0];
    }

    private static RevisionInfo? HeadOf(SqliteConnection c, SqliteTransaction? tx, long branchId)
    {
        var list = Revisions(c, tx, "WHERE r.branch = $b ORDER BY r.id DESC LIMIT 1", ("$b", branchId));
        return list.IsEmpty ? null : list[0];
    }

    private static ImmutableArray<RevisionInfo> Revisions(SqliteConnection c, SqliteTransaction? tx, string tail, params (string Name, object? Value)[] args)
    {
        using var q = Command(c, tx, "SELECT r.id, r.design, r.branch, b.name, r.parent, r.author, r.message, r.created_utc, r.design_name, r.sha256, r.restored_from FROM revisions r JOIN branches b ON b.id = r.branch " + tail + ";", args);
        using var r = q.ExecuteReader();
        var list = new List<RevisionInfo>();
        while (r.Read())
        {
            list.Add(new RevisionInfo(r.GetInt64(0), r.GetInt64(1), r.GetInt64(2), r.GetString(3), r.IsDBNull(4) ? null : r.GetInt64(4), r.GetString(5), r.GetString(6),
                ParseUtc(r.GetString(7)), r.GetString(8), r.GetString(9), r.IsDBNull(10) ? null : r.GetInt64(10)));
        }

        return [.. list];
    }

    private static string? Refuse(string? libraryName, string? author, string? message)
    {
        if (libraryName is not null && libraryName.Length is 0 or > MaxNameLength)
        {
            return $"library name: '{libraryName}' has {libraryName.Length} characters; give 1 to {MaxNameLength}.";
        }

        if ((author ?? string.Empty).Trim().Length > MaxNameLength)
        {
            return $"author: at most {MaxNameLength} characters.";
        }

        if ((message ?? string.Empty).Trim().Length > MaxMessageLength)
        {
            return $"message: at most {MaxMessageLength} characters.";
        }

        return null;
    }

    private static string? NormalizeTags(IEnumerable<string>? tags, out List<string> list)
    {
        list = [.. (tags ?? []).Select(t => (t ?? string.Empty).Trim()).Where(t => t.Length > 0).Distinct(StringComparer.OrdinalIgnoreCase)];
        var bad = list.FirstOrDefault(t => t.Length > MaxNameLength || t.Contains(',', StringComparison.Ordinal));
        return bad is null ? null : $"tags: '{bad}' is not a tag; a tag has 1 to {MaxNameLength} characters and no comma.";
    }

    private static bool TryWrite(LoopDesign design, out string content, out string? error)
    {
        try
        {
            content = DesignFile.Write(design);
            error = null;
            return true;
        }
        catch (ArgumentException ex)
        {
            content = string.Empty;
            error = "The design cannot be saved: " + ex.Message;
            return false;
        }
    }

    private static string EscapeLike(string word) => word.Replace("\\", "\\\\", StringComparison.Ordinal).Replace("%", "\\%", StringComparison.Ordinal).Replace("_", "\\_", StringComparison.Ordinal);

    private static string Now() => DateTime.UtcNow.ToString("O", CultureInfo.InvariantCulture);

    private static DateTime ParseUtc(string text) => DateTime.Parse(text, CultureInfo.InvariantCulture, DateTimeStyles.RoundtripKind);

    private static SqliteCommand Command(SqliteConnection c, SqliteTransaction? tx, string sql, params (string Name, object? Value)[] args)
    {
        var q = c.CreateCommand();
        q.Transaction = tx;
        q.CommandText = sql;
        foreach (var (name, value) in args)
        {
            q.Parameters.AddWithValue(name, value ?? DBNull.Value);
        }

        return q;
    }

    private static void Execute(SqliteConnection c, SqliteTransaction? tx, string sql, params (string Name, object? Value)[] args)
    {
        using var q = Command(c, tx, sql, args);
        q.ExecuteNonQuery();
    }

    private static object? Scalar(SqliteConnection c, SqliteTransaction? tx, string sql, params (string Name, object? Value)[] args)
    {
        using var q = Command(c, tx, sql, args);
        return q.ExecuteScalar();
    }

    private static long Insert(SqliteConnection c, SqliteTransaction tx, string sql, params (string Name, object? Value)[] args)
        => Convert.ToInt64(Scalar(c, tx, sql, args), CultureInfo.InvariantCulture);
}
