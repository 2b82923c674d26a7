namespace CableFault.Cli.Infrastructure;

/// <summary>
/// Writes a file so that readers see either the old content or the complete new content, never a half-written file:
/// write to a temporary file in the same folder, flush to disk, then rename over the target.
/// </summary>
public static class AtomicFile
{
    /// <summary>Writes the file through <paramref name="write"/>; on failure the target is untouched and the temporary file removed.</summary>
    public static void Write(string path, Action<Stream> write)
    {
        string fullPath = Path.GetFullPath(path);
        string folder = Path.GetDirectoryName(fullPath) ?? ".";
        if (!Directory.Exists(folder))
            throw new InputException($"{path}: folder '{folder}' does not exist; create it or choose another output path");
        if (Directory.Exists(fullPath))
            throw new InputException($"{path}: is a folder; give a file name for the output");
        string temporary = Path.Combine(folder, $".{Path.GetFileName(fullPath)}.{Environment.ProcessId}.{Guid.NewGuid():N}.tmp");
        try
        {
            using (var stream = new FileStream(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                write(stream);
                stream.Flush(flushToDisk: true);
            }
            File.Move(temporary, fullPath, overwrite: true);
        }
        catch (UnauthorizedAccessException e)
        {
            throw new InputException($"{path}: cannot write here ({e.Message}); choose another output path", e);
        }
        catch (IOException e) when (e is not FileNotFoundException)
        {
            throw new InputException($"{path}: cannot write ({e.Message}); check the disk and the path", e);
        }
        finally
        {
            if (File.Exists(temporary)) File.Delete(temporary);
        }
    }

    /// <summary>Writes text (UTF-8, no BOM) atomically.</summary>
    public static void WriteText(string path, Action<TextWriter> write) =>
        Write(path, stream =>
        {
            using var writer = new StreamWriter(stream, new System.Text.UTF8Encoding(false), leaveOpen: true);
            write(writer);
        });
}
