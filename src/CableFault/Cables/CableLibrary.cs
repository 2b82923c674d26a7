namespace CableFault.Cables;

/// <summary>
/// The cable types known to a run: the built-in generic types plus any user-defined ones (which win on a name clash).
/// Designations are matched case-insensitively, ignoring '-', '_' and spaces ("rg58" finds "RG-58").
/// </summary>
public sealed class CableLibrary
{
    private readonly Dictionary<string, CableType> _byKey;

    /// <summary>Creates a library from types; later entries replace earlier ones with the same designation.</summary>
    public CableLibrary(IEnumerable<CableType> types)
    {
        _byKey = new Dictionary<string, CableType>(StringComparer.Ordinal);
        var ordered = new List<CableType>();
        foreach (var type in types)
        {
            string key = Key(type.Designation);
            if (_byKey.ContainsKey(key)) ordered.RemoveAll(t => Key(t.Designation) == key);
            _byKey[key] = type;
            ordered.Add(type);
        }
        Types = ordered;
    }

    /// <summary>The built-in generic types only.</summary>
    public static CableLibrary BuiltIn { get; } = new(BuiltInCableTypes.All);

    /// <summary>All types, in listing order.</summary>
    public IReadOnlyList<CableType> Types { get; }

    /// <summary>A library with these user types added (replacing built-ins of the same name).</summary>
    public CableLibrary With(IEnumerable<CableType> userTypes) => new(Types.Concat(userTypes));

    /// <summary>Finds a type by designation, or null.</summary>
    public CableType? Find(string designation) =>
        _byKey.TryGetValue(Key(designation), out var type) ? type : null;

    /// <summary>Finds a type by designation or throws an <see cref="InputException"/> listing the known names.</summary>
    public CableType Get(string designation) =>
        Find(designation) ?? throw new InputException(
            $"unknown cable type '{designation}'; known types: {string.Join(", ", Types.Select(t => t.Designation))} (or add your own with a cable file)");

    private static string Key(string designation) =>
        new string(designation.Where(c => c is not ('-' or '_' or ' ')).ToArray()).ToUpperInvariant();
}
