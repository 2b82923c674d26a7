using CableFault.Traces;

namespace CableFault.History;

/// <summary>One stored trace in full.</summary>
/// <param name="Entry">The listing fields.</param>
/// <param name="OriginalBytes">The original file, byte for byte.</param>
/// <param name="Trace">The trace as read when it was stored.</param>
/// <param name="SettingsJson">The cable settings it was read with, as JSON.</param>
/// <param name="LocateJson">The locate result JSON, or null.</param>
/// <param name="CheckJson">For a check: verdict and reasons as JSON; else null.</param>
public sealed record StoredTrace(HistoryEntry Entry, byte[] OriginalBytes, Trace Trace, string SettingsJson, string? LocateJson, string? CheckJson);
