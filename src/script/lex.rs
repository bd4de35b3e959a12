//! A small Rhai-aware scanner: enough to skip strings and comments, find top-level imports, and
//! tell what the cursor is in for completion. The real parsing is Rhai's.

/// A token with its byte range and the brace depth it sits at.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Token {
    pub(crate) kind: TokKind,
    pub(crate) start: usize,
    pub(crate) end: usize,
    pub(crate) depth: usize,
}

#[derive(Clone, Debug, PartialEq)]
pub(crate) enum TokKind {
    Ident(String),
    /// A string literal's content (escapes kept as written); `closed` is false at end of input.
    Str {
        content: String,
        closed: bool,
    },
    Punct(char),
    Number,
}

/// Tokens of `code`, comments dropped.
pub(crate) fn tokens(code: &str) -> Vec<Token> {
    scan(code).0
}

/// Tokens of `code`, and whether a block comment is still open at the end.
pub(crate) fn scan(code: &str) -> (Vec<Token>, bool) {
    let mut open_comment = false;
    let b: Vec<(usize, char)> = code.char_indices().collect();
    let end_of = |i: usize| b.get(i).map_or(code.len(), |&(p, _)| p);
    let mut out = Vec::new();
    let mut depth = 0usize;
    let mut i = 0;
    while i < b.len() {
        let (pos, c) = b[i];
        let next = b.get(i + 1).map(|&(_, c)| c);
        if c.is_whitespace() {
            i += 1;
        } else if c == '/' && next == Some('/') {
            while i < b.len() && b[i].1 != '\n' {
                i += 1;
            }
        } else if c == '/' && next == Some('*') {
            // Rhai block comments nest.
            let mut level = 0;
            while i < b.len() {
                let n = b.get(i + 1).map(|&(_, c)| c);
                if b[i].1 == '/' && n == Some('*') {
                    level += 1;
                    i += 2;
                } else if b[i].1 == '*' && n == Some('/') {
                    level -= 1;
                    i += 2;
                    if level == 0 {
                        break;
                    }
                } else {
                    i += 1;
                }
            }
            open_comment = level > 0;
        } else if c == '"' || c == '`' || c == '\'' {
            let quote = c;
            let mut content = String::new();
            let mut closed = false;
            i += 1;
            while i < b.len() {
                let ch = b[i].1;
                if ch == '\\' && quote != '`' {
                    content.push(ch);
                    if let Some(&(_, e)) = b.get(i + 1) {
                        content.push(e);
                    }
                    i += 2;
                    continue;
                }
                if ch == quote {
                    closed = true;
                    i += 1;
                    break;
                }
                content.push(ch);
                i += 1;
            }
            out.push(Token {
                kind: TokKind::Str { content, closed },
                start: pos,
                end: end_of(i),
                depth,
            });
        } else if c.is_alphabetic() || c == '_' {
            let s = i;
            while i < b.len() && (b[i].1.is_alphanumeric() || b[i].1 == '_') {
                i += 1;
            }
            let text: String = b[s..i].iter().map(|&(_, c)| c).collect();
            out.push(Token {
                kind: TokKind::Ident(text),
                start: pos,
                end: end_of(i),
                depth,
            });
        } else if c.is_ascii_digit() {
            while i < b.len() && (b[i].1.is_ascii_alphanumeric() || b[i].1 == '.' || b[i].1 == '_')
            {
                i += 1;
            }
            out.push(Token {
                kind: TokKind::Number,
                start: pos,
                end: end_of(i),
                depth,
            });
        } else {
            if c == '}' {
                depth = depth.saturating_sub(1);
            }
            out.push(Token {
                kind: TokKind::Punct(c),
                start: pos,
                end: end_of(i + 1),
                depth,
            });
            if c == '{' {
                depth += 1;
            }
            i += 1;
        }
    }
    (out, open_comment)
}

/// True when the code stops inside a string, a comment or an open bracket: more must follow.
pub(crate) fn unfinished(code: &str) -> bool {
    let (t, open_comment) = scan(code);
    let mut depth = 0i64;
    for tok in &t {
        match tok.kind {
            TokKind::Punct('(' | '[' | '{') => depth += 1,
            TokKind::Punct(')' | ']' | '}') => depth -= 1,
            _ => {}
        }
    }
    let open_string = matches!(
        t.last(),
        Some(Token {
            kind: TokKind::Str { closed: false, .. },
            ..
        })
    );
    open_comment || open_string || depth > 0
}

/// `import "path" as alias;` statements at the top level of `code`.
pub(crate) fn top_level_imports(code: &str) -> Vec<(String, String)> {
    let t = tokens(code);
    let mut out = Vec::new();
    for w in t.windows(4) {
        if let [
            Token {
                kind: TokKind::Ident(kw),
                depth: 0,
                ..
            },
            Token {
                kind:
                    TokKind::Str {
                        content,
                        closed: true,
                    },
                ..
            },
            Token {
                kind: TokKind::Ident(as_kw),
                ..
            },
            Token {
                kind: TokKind::Ident(alias),
                ..
            },
        ] = w
        {
            if kw == "import" && as_kw == "as" {
                out.push((content.clone(), alias.clone()));
            }
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn imports_skip_strings_comments_and_blocks() {
        let code = r#"
            import "table" as t;   // import "x" as y
            /* import "no" as no; */
            let s = "import \"z\" as z";
            fn f() { import "inner" as i; }
            import "bridges" as b;
        "#;
        assert_eq!(
            top_level_imports(code),
            vec![
                ("table".to_string(), "t".to_string()),
                ("bridges".to_string(), "b".to_string())
            ]
        );
    }

    #[test]
    fn unterminated_string_is_marked() {
        let t = tokens("q(\"35");
        assert!(matches!(&t[2].kind, TokKind::Str { closed: false, content } if content == "35"));
    }
}
