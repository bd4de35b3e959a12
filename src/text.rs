//! Text helpers every layer may use (std only): the physics layer builds its report tables as
//! HTML text, and the display layer shows them, so the escaper lives below both.

/// Escapes text for inclusion in HTML element content or attribute values.
///
/// ```
/// assert_eq!(gaugebook::html_escape("a<b & \"c\""), "a&lt;b &amp; &quot;c&quot;");
/// ```
pub fn html_escape(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    for c in text.chars() {
        match c {
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '&' => out.push_str("&amp;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
    out
}
