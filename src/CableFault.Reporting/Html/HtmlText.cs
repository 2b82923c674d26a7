using System.Text;

namespace CableFault.Reporting.Html;

/// <summary>Escapes text for HTML element content and quoted attribute values.</summary>
public static class HtmlText
{
    /// <summary>
    /// Replaces the five characters with a meaning in HTML (&amp; &lt; &gt; " ') by character references, and drops
    /// control characters other than tab and newline (they are not allowed in HTML text). Everything else, ± and
    /// accented letters included, stays as it is: the document is UTF-8.
    /// </summary>
    public static string Escape(string? text)
    {
        if (string.IsNullOrEmpty(text)) return "";
        var builder = new StringBuilder(text.Length + 16);
        foreach (char c in text)
        {
            switch (c)
            {
                case '&': builder.Append("&amp;"); break;
                case '<': builder.Append("&lt;"); break;
                case '>': builder.Append("&gt;"); break;
                case '"': builder.Append("&quot;"); break;
                case '\'': builder.Append("&#39;"); break;
                case '\t' or '\n': builder.Append(c); break;
                default:
                    if (!char.IsControl(c)) builder.Append(c);
                    break;
            }
        }
        return builder.ToString();
    }
}
