using CableFault.Reporting.Plots;

namespace CableFault.Cli.Infrastructure;

/// <summary>Writes --png / --svg outputs atomically.</summary>
public static class PlotOutput
{
    /// <summary>Renders the figure only when an image was asked for.</summary>
    public static void Write(FileInfo? png, FileInfo? svg, Func<Figure> figure, CliContext context)
    {
        if (png is null && svg is null) return;
        var built = figure();
        if (png is not null)
        {
            byte[] bytes = FigureRenderer.ToPng(built);
            AtomicFile.Write(png.FullName, stream => stream.Write(bytes));
            context.Error.WriteLine($"wrote {png.Name}");
        }
        if (svg is not null)
        {
            string text = FigureRenderer.ToSvg(built);
            AtomicFile.WriteText(svg.FullName, writer => writer.Write(text));
            context.Error.WriteLine($"wrote {svg.Name}");
        }
    }
}
