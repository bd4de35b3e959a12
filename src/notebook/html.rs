//! A notebook as a static HTML page, for reports that open in any browser without Jupyter:
//! markdown cells through a small converter (headings, paragraphs, lists, code, emphasis),
//! code cells with their source and outputs, figures inline (SVG as markup, PNG as a data URL).
//! Every text the notebook holds is escaped; only the outputs' own `text/html` and
//! `image/svg+xml`, which Gaugebook itself produced, are inserted as markup.

use serde_json::Value;

use super::format::{CellKind, Notebook, Output};
use crate::html_escape;

/// The page's style: our own, plain and printable.
const STYLE: &str = "body{font-family:system-ui,sans-serif;max-width:60rem;margin:2rem auto;\
padding:0 1rem;color:#1d2630;line-height:1.45}\
h1,h2,h3,h4{color:#0f3d5e}section.notebook{border-top:2px solid #0f3d5e;margin-top:2.5rem}\
pre{background:#f4f6f8;padding:.6rem .8rem;overflow-x:auto;border-radius:4px}\
pre.source{border-left:3px solid #2f7bbf}pre.stderr,pre.error{background:#fbeeee;color:#8a1c1c}\
.caution{background:#fff6e0;border:1px solid #e0b44a;padding:.6rem .9rem;border-radius:4px}\
table{border-collapse:collapse;margin:.5rem 0}td,th{border:1px solid #c9d2db;padding:.2rem .5rem;\
text-align:left}code{background:#f4f6f8;padding:0 .2rem}figure{margin:.5rem 0}";

impl Notebook {
    /// The notebook as an HTML `<section>`: its cells in order, each code cell's source and
    /// outputs; `title` heads the section.
    ///
    /// ```
    /// use gaugebook::{Cell, CellKind, Notebook, Output};
    /// let mut md = Cell::code("m", "# Beam check\nThe *invented* beam, `B-2`.");
    /// md.kind = CellKind::Markdown;
    /// let mut code = Cell::code("c", "print(2 * q(\"1 kN\"))");
    /// code.outputs.push(Output::Stream { name: "stdout".into(), text: "2 kN <ok>\n".into() });
    /// let nb = Notebook { cells: vec![md, code], metadata: Default::default() };
    /// let html = nb.to_html_section("beam");
    /// assert!(html.contains("<h1>Beam check</h1>"));
    /// assert!(html.contains("<em>invented</em>") && html.contains("<code>B-2</code>"));
    /// assert!(html.contains("2 kN &lt;ok&gt;"));
    /// ```
    pub fn to_html_section(&self, title: &str) -> String {
        let mut out = format!(
            "<section class=\"notebook\">\n<p class=\"origin\">{}</p>\n",
            html_escape(title)
        );
        for cell in &self.cells {
            match cell.kind {
                CellKind::Markdown => out.push_str(&markdown_to_html(&cell.source)),
                CellKind::Raw => {
                    out.push_str(&format!("<pre>{}</pre>\n", html_escape(&cell.source)));
                }
                CellKind::Code => {
                    if cell.source.trim().is_empty() {
                        continue;
                    }
                    out.push_str(&format!(
                        "<pre class=\"source\">{}</pre>\n",
                        html_escape(&cell.source)
                    ));
                    for o in &cell.outputs {
                        out.push_str(&output_html(o));
                    }
                }
            }
        }
        out.push_str("</section>\n");
        out
    }
}

/// A whole HTML page around `body`, with the page style and a title.
///
/// ```
/// let page = gaugebook::html_page("Report", "<p>hello</p>");
/// assert!(page.starts_with("<!DOCTYPE html>"));
/// assert!(page.contains("<title>Report</title>") && page.contains("<p>hello</p>"));
/// ```
pub fn html_page(title: &str, body: &str) -> String {
    format!(
        "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n\
         <meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n\
         <title>{}</title>\n<style>{STYLE}</style>\n</head>\n<body>\n{body}</body>\n</html>\n",
        html_escape(title)
    )
}

fn text_of(v: &Value) -> String {
    match v {
        Value::String(s) => s.clone(),
        Value::Array(lines) => lines.iter().filter_map(Value::as_str).collect(),
        other => other.to_string(),
    }
}

fn output_html(o: &Output) -> String {
    match o {
        Output::Stream { name, text } => {
            let class = if name == "stderr" { "stderr" } else { "stdout" };
            format!("<pre class=\"{class}\">{}</pre>\n", html_escape(text))
        }
        Output::DisplayData { data, .. } | Output::ExecuteResult { data, .. } => {
            if let Some(svg) = data.get("image/svg+xml") {
                format!("<figure>{}</figure>\n", text_of(svg))
            } else if let Some(png) = data.get("image/png") {
                format!(
                    "<figure><img alt=\"figure\" src=\"data:image/png;base64,{}\"></figure>\n",
                    text_of(png).trim()
                )
            } else if let Some(html) = data.get("text/html") {
                format!("<div class=\"result\">{}</div>\n", text_of(html))
            } else if let Some(plain) = data.get("text/plain") {
                format!(
                    "<pre class=\"result\">{}</pre>\n",
                    html_escape(&text_of(plain))
                )
            } else {
                String::new()
            }
        }
        Output::Error {
            ename,
            evalue,
            traceback,
        } => format!(
            "<pre class=\"error\">{}: {}\n{}</pre>\n",
            html_escape(ename),
            html_escape(evalue),
            html_escape(&traceback.join("\n"))
        ),
    }
}

/// The markdown the example notebooks use: ATX headings, paragraphs, `-`/`*`/`1.` lists, fenced
/// code, and inline code, `**strong**` and `*emphasis*`. Anything else shows as text.
fn markdown_to_html(md: &str) -> String {
    let mut out = String::new();
    let mut para: Vec<String> = Vec::new();
    let mut list: Option<&'static str> = None;
    let mut fence: Option<String> = None;
    let flush_para = |para: &mut Vec<String>, out: &mut String| {
        if !para.is_empty() {
            out.push_str(&format!("<p>{}</p>\n", inline(&para.join(" "))));
            para.clear();
        }
    };
    let close_list = |list: &mut Option<&'static str>, out: &mut String| {
        if let Some(tag) = list.take() {
            out.push_str(&format!("</{tag}>\n"));
        }
    };
    for line in md.lines() {
        if let Some(code) = fence.as_mut() {
            if line.trim_start().starts_with("```") {
                out.push_str(&format!("<pre>{}</pre>\n", html_escape(code)));
                fence = None;
            } else {
                code.push_str(line);
                code.push('\n');
            }
            continue;
        }
        let t = line.trim();
        if t.starts_with("```") {
            flush_para(&mut para, &mut out);
            close_list(&mut list, &mut out);
            fence = Some(String::new());
            continue;
        }
        if t.is_empty() {
            flush_para(&mut para, &mut out);
            close_list(&mut list, &mut out);
            continue;
        }
        let hashes = t.chars().take_while(|&c| c == '#').count();
        if (1..=6).contains(&hashes) && t[hashes..].starts_with(' ') {
            flush_para(&mut para, &mut out);
            close_list(&mut list, &mut out);
            out.push_str(&format!(
                "<h{hashes}>{}</h{hashes}>\n",
                inline(t[hashes..].trim())
            ));
            continue;
        }
        let bullet = t
            .strip_prefix("- ")
            .or_else(|| t.strip_prefix("* "))
            .map(|rest| ("ul", rest));
        let numbered = t
            .split_once(". ")
            .filter(|(n, _)| !n.is_empty() && n.chars().all(|c| c.is_ascii_digit()))
            .map(|(_, rest)| ("ol", rest));
        if let Some((tag, item)) = bullet.or(numbered) {
            flush_para(&mut para, &mut out);
            if list != Some(tag) {
                close_list(&mut list, &mut out);
                out.push_str(&format!("<{tag}>\n"));
                list = Some(tag);
            }
            out.push_str(&format!("<li>{}</li>\n", inline(item)));
            continue;
        }
        if list.is_some() && line.starts_with("  ") {
            // A continuation line of the last list item: join it to that item.
            if out.ends_with("</li>\n") {
                out.truncate(out.len() - "</li>\n".len());
                out.push(' ');
                out.push_str(&inline(t));
                out.push_str("</li>\n");
                continue;
            }
        }
        close_list(&mut list, &mut out);
        para.push(t.to_string());
    }
    if let Some(code) = fence {
        out.push_str(&format!("<pre>{}</pre>\n", html_escape(&code)));
    }
    flush_para(&mut para, &mut out);
    close_list(&mut list, &mut out);
    out
}

/// Inline markup of one line: the text is escaped first, then `code`, **strong**, *emphasis*.
fn inline(text: &str) -> String {
    let mut out = String::new();
    // Code spans first, so their content is left alone.
    for (i, part) in text.split('`').enumerate() {
        if i % 2 == 1 {
            out.push_str(&format!("<code>{}</code>", html_escape(part)));
        } else {
            out.push_str(&emphasis(&html_escape(part)));
        }
    }
    out
}

fn emphasis(escaped: &str) -> String {
    let mut out = String::new();
    for (i, part) in escaped.split("**").enumerate() {
        if i % 2 == 1 {
            out.push_str(&format!("<strong>{part}</strong>"));
        } else {
            let pieces: Vec<&str> = part.split('*').collect();
            // Only pairs of single stars are emphasis; an odd last star stays a star.
            for (k, p) in pieces.iter().enumerate() {
                if k % 2 == 1 && k + 1 < pieces.len() {
                    out.push_str(&format!("<em>{p}</em>"));
                } else {
                    if k % 2 == 1 {
                        out.push('*');
                    }
                    out.push_str(p);
                }
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn markdown_lists_headings_and_fences() {
        let html = markdown_to_html(
            "## Steps\n\n1. zero the rig\n2. load to **500 N**\n   and hold\n\n- a\n- b `x<y`\n\n```\nlet a = 1;\n```\ntext *with* 2 * 3",
        );
        assert!(html.contains("<h2>Steps</h2>"), "{html}");
        assert!(
            html.contains("<ol>\n<li>zero the rig</li>\n<li>load to <strong>500 N</strong> and hold</li>\n</ol>"),
            "{html}"
        );
        assert!(
            html.contains("<ul>\n<li>a</li>\n<li>b <code>x&lt;y</code></li>\n</ul>"),
            "{html}"
        );
        assert!(html.contains("<pre>let a = 1;\n</pre>"), "{html}");
        assert!(html.contains("<p>text <em>with</em> 2 * 3</p>"), "{html}");
    }

    #[test]
    fn outputs_prefer_figures_then_html_then_text() {
        let mut data = std::collections::BTreeMap::new();
        data.insert("text/plain".to_string(), Value::String("fig".into()));
        data.insert(
            "image/svg+xml".to_string(),
            Value::String("<svg></svg>".into()),
        );
        let o = Output::DisplayData {
            data,
            metadata: Default::default(),
        };
        assert_eq!(output_html(&o), "<figure><svg></svg></figure>\n");
        let e = Output::Error {
            ename: "UnitError".into(),
            evalue: "cannot add 5 V and 350 Ω".into(),
            traceback: vec!["cell[1]:1:3: <here>".into()],
        };
        assert!(output_html(&e).contains("cell[1]:1:3: &lt;here&gt;"));
    }
}
