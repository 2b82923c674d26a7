using System.Globalization;
using System.Text.Json;
using CableFault.Json;

namespace CableFault.Cables;

/// <summary>
/// Reads and writes user cable-type files (our own JSON schema):
/// <code>
/// { "cables": [ { "designation": "FEEDER-7", "description": "...", "z0_ohms": 50, "vf": 0.82,
///                 "loss": [ { "mhz": 100, "db_per_100m": 6.1 }, { "mhz": 1000, "db_per_100m": 21 } ],
///                 "dc_loop_ohms_per_m": 0, "insulation": "foam_pe", "source": "data sheet rev C" } ] }
/// </code>
/// </summary>
public static class CableTypeJson
{
    /// <summary>Largest cable file accepted, bytes.</summary>
    public const long MaximumBytes = 4_000_000;

    private static readonly string[] CableFields = ["designation", "description", "z0_ohms", "vf", "loss", "dc_loop_ohms_per_m", "insulation", "source"];

    /// <summary>Reads the types in a cable file; every problem is reported at once as an <see cref="InputException"/>.</summary>
    public static IReadOnlyList<CableType> Read(Stream stream, string sourceName)
    {
        using var document = JsonProblems.Parse(stream, sourceName, MaximumBytes);
        var problems = new JsonProblems();
        var root = document.RootElement;
        var types = new List<CableType>();
        if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("cables", out var cables) || cables.ValueKind != JsonValueKind.Array)
            throw new InputException($"{sourceName}: expected an object with a \"cables\" array, e.g. {{\"cables\": [{{\"designation\": \"MY-COAX\", \"z0_ohms\": 50, \"vf\": 0.8}}]}}");
        int index = 0;
        foreach (var cable in cables.EnumerateArray())
        {
            string path = $"cables[{index++}]";
            if (cable.ValueKind != JsonValueKind.Object) { problems.Add(path, "expected an object"); continue; }
            problems.RejectUnknown(cable, path, CableFields);
            var type = ReadOne(cable, path, problems);
            if (type is not null) types.Add(type);
        }
        problems.ThrowIfAny(sourceName);
        return types;
    }

    /// <summary>Reads one cable type object (also used inline in network files).</summary>
    internal static CableType? ReadOne(JsonElement cable, string path, JsonProblems problems, string? defaultDesignation = null)
    {
        string? designation = problems.Text(cable, "designation", path, required: defaultDesignation is null) ?? defaultDesignation;
        double? z0 = problems.Number(cable, "z0_ohms", path, required: true, min: PlausibleRanges.MinimumImpedanceOhms, max: PlausibleRanges.MaximumImpedanceOhms);
        double? vf = problems.Number(cable, "vf", path, required: true, min: PlausibleRanges.MinimumVelocityFactor, max: 1);
        double dc = problems.Number(cable, "dc_loop_ohms_per_m", path, required: false, min: 0, max: PlausibleRanges.MaximumDcLoopOhmsPerMeter) ?? 0;
        var loss = ReadLoss(cable, path, problems, dc);
        if (designation is null || z0 is null || vf is null || loss is null) return null;
        return new CableType(designation, problems.Text(cable, "description", path, false) ?? "user-defined",
            z0.Value, vf.Value, loss, InsulationClassRanges.Parse(problems.Text(cable, "insulation", path, false)),
            problems.Text(cable, "source", path, false) ?? "user file");
    }

    private static CableLossModel? ReadLoss(JsonElement cable, string path, JsonProblems problems, double dcOhmsPerMeter)
    {
        if (!cable.TryGetProperty("loss", out var loss) || loss.ValueKind == JsonValueKind.Null)
            return new CableLossModel(0, 0, dcOhmsPerMeter);
        if (loss.ValueKind != JsonValueKind.Array || loss.GetArrayLength() is < 1 or > 2)
        {
            problems.Add($"{path}.loss", "expected one or two points like [{\"mhz\": 100, \"db_per_100m\": 6.1}]");
            return null;
        }
        var points = new List<(double Mhz, double Db)>();
        int i = 0;
        foreach (var point in loss.EnumerateArray())
        {
            string at = $"{path}.loss[{i++}]";
            if (point.ValueKind != JsonValueKind.Object) { problems.Add(at, "expected an object with mhz and db_per_100m"); continue; }
            double? mhz = problems.Number(point, "mhz", at, true, 0, PlausibleRanges.MaximumLossFrequencyMhz, exclusiveMin: true);
            double? db = problems.Number(point, "db_per_100m", at, true, 0, PlausibleRanges.MaximumAttenuationDbPer100m);
            if (mhz is not null && db is not null) points.Add((mhz.Value, db.Value));
        }
        if (points.Count != loss.GetArrayLength()) return null;
        if (points.Count == 2 && points[0].Mhz == points[1].Mhz)
        {
            problems.Add($"{path}.loss", "the two loss points need different frequencies");
            return null;
        }
        return points.Count == 1
            ? CableLossModel.FromDatasheet(points[0].Db, points[0].Mhz * 1e6, dcResistanceOhmsPerMeter: dcOhmsPerMeter)
            : CableLossModel.FromDatasheet(points[0].Db, points[0].Mhz * 1e6, points[1].Db, points[1].Mhz * 1e6, dcOhmsPerMeter);
    }

    /// <summary>Writes a cable file with the given types; loss is written at 10 MHz and 1 GHz, which reproduces the √f + f model exactly.</summary>
    public static void Write(IEnumerable<CableType> types, Stream stream)
    {
        using var writer = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true });
        writer.WriteStartObject();
        writer.WriteStartArray("cables");
        foreach (var type in types)
        {
            writer.WriteStartObject();
            writer.WriteString("designation", type.Designation);
            writer.WriteString("description", type.Description);
            writer.WriteNumber("z0_ohms", type.ImpedanceOhms);
            writer.WriteNumber("vf", type.VelocityFactor);
            if (!type.Loss.IsLossless)
            {
                writer.WriteStartArray("loss");
                foreach (double mhz in new[] { 10.0, 1000.0 })
                {
                    writer.WriteStartObject();
                    writer.WriteNumber("mhz", mhz);
                    writer.WriteNumber("db_per_100m", Math.Round(type.Loss.AttenuationDbPer100m(mhz * 1e6), 9));
                    writer.WriteEndObject();
                }
                writer.WriteEndArray();
            }
            if (type.Loss.DcResistanceOhmsPerMeter > 0) writer.WriteNumber("dc_loop_ohms_per_m", type.Loss.DcResistanceOhmsPerMeter);
            writer.WriteString("insulation", InsulationClassRanges.Name(type.InsulationClass));
            if (!string.IsNullOrEmpty(type.Source)) writer.WriteString("source", type.Source);
            writer.WriteEndObject();
        }
        writer.WriteEndArray();
        writer.WriteEndObject();
    }
}
