namespace CableFault.Cli.Infrastructure;

/// <summary>Opens user files with one clear line when they cannot be read.</summary>
public static class InputFiles
{
    /// <summary>Opens a file for reading or throws an <see cref="InputException"/> naming it.</summary>
    public static FileStream Open(string path, string what)
    {
        if (Directory.Exists(path))
            throw new InputException($"{path}: is a folder, not a {what} file");
        if (!File.Exists(path))
            throw new InputException($"{path}: {what} file not found; check the path");
        try
        {
            return new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException($"{path}: cannot open the {what} file ({e.Message})", e);
        }
    }

    /// <summary>Reads a file through <paramref name="read"/>, naming the file in any error.</summary>
    public static T Read<T>(FileInfo file, string what, Func<Stream, string, T> read)
    {
        using var stream = Open(file.FullName, what);
        return read(stream, file.Name);
    }
}
