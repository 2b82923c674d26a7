using System.Diagnostics;
using System.Globalization;

namespace CableFault.Cli.Infrastructure;

/// <summary>
/// Progress of a batch on stderr. On a terminal: one line redrawn in place — a bar, done/total, skipped, elapsed and an
/// estimate of the time left. When stderr is redirected (a log file, a pipe, a test): plain lines, one per finished
/// input, so the log reads top to bottom. Other messages (warnings, skipped inputs) go through <see cref="Line"/>,
/// which keeps them apart from the bar. Thread-safe.
/// </summary>
public sealed class BatchProgress
{
    private const int BarWidth = 28;
    private readonly TextWriter _error;
    private readonly bool _terminal;
    private readonly int _total;
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly object _gate = new();
    private int _done;
    private int _skipped;
    private int _barLength;

    /// <summary>Starts the clock.</summary>
    /// <param name="error">Where progress goes (stderr).</param>
    /// <param name="terminal">True when stderr is an interactive terminal (redraw in place).</param>
    /// <param name="total">Number of inputs.</param>
    public BatchProgress(TextWriter error, bool terminal, int total)
    {
        _error = error;
        _terminal = terminal;
        _total = total;
        if (_terminal) lock (_gate) Draw();
    }

    /// <summary>True when stderr is the process's own and is a terminal.</summary>
    public static bool IsTerminal(TextWriter error) =>
        ReferenceEquals(error, Console.Error) && !Console.IsErrorRedirected;

    /// <summary>Prints a message line without breaking the bar.</summary>
    public void Line(string message)
    {
        lock (_gate)
        {
            Clear();
            _error.WriteLine(message);
            if (_terminal) Draw();
        }
    }

    /// <summary>Records one finished input.</summary>
    /// <param name="name">The input's name.</param>
    /// <param name="skipped">True when it was bad and skipped.</param>
    public void Finished(string name, bool skipped)
    {
        lock (_gate)
        {
            _done++;
            if (skipped) _skipped++;
            if (_terminal)
            {
                Clear();
                Draw();
            }
            else
            {
                _error.WriteLine(string.Create(CultureInfo.InvariantCulture,
                    $"[{_done}/{_total}] {name}: {(skipped ? "skipped" : "done")}{Remaining(", ")}"));
            }
        }
    }

    /// <summary>Removes the bar at the end so that the summary starts on a clean line.</summary>
    public void Complete()
    {
        lock (_gate)
        {
            Clear();
            _error.Flush();
        }
    }

    private string Remaining(string prefix)
    {
        if (_done == 0 || _done >= _total) return "";
        double perInput = _clock.Elapsed.TotalSeconds / _done;
        return prefix + "about " + Duration(perInput * (_total - _done)) + " left";
    }

    private void Draw()
    {
        int filled = _total == 0 ? BarWidth : (int)Math.Round(BarWidth * (double)_done / _total);
        string skipped = _skipped > 0 ? $", {_skipped} skipped" : "";
        string text = $"[{new string('#', filled)}{new string('.', BarWidth - filled)}] {_done}/{_total}{skipped}  {Duration(_clock.Elapsed.TotalSeconds)} elapsed{Remaining(", ")}";
        _error.Write("\r" + text);
        _barLength = text.Length;
        _error.Flush();
    }

    private void Clear()
    {
        if (!_terminal || _barLength == 0) return;
        _error.Write("\r" + new string(' ', _barLength) + "\r");
        _barLength = 0;
    }

    /// <summary>"42 s", "3 min 05 s", "1 h 02 min".</summary>
    internal static string Duration(double seconds)
    {
        var span = TimeSpan.FromSeconds(Math.Max(0, Math.Round(seconds)));
        if (span.TotalHours >= 1) return $"{(int)span.TotalHours} h {span.Minutes:00} min";
        if (span.TotalMinutes >= 1) return $"{span.Minutes} min {span.Seconds:00} s";
        return $"{span.Seconds} s";
    }
}
