//! The input history of one kernel session, answering `history_request` by tail, range and
//! search (messaging specification, "History").

use serde_json::{Value, json};

/// The session number this kernel reports: history is kept in memory for the running session
/// only, which the specification numbers from 1 (0 or negative counts back from the current one).
const SESSION: i64 = 1;

/// Stored cells: execution count, input and the plain-text result (if any).
#[derive(Debug, Default)]
pub(crate) struct History {
    entries: Vec<(i64, String, Option<String>)>,
}

impl History {
    /// Records one executed cell.
    pub fn push(&mut self, count: i64, input: &str, output: Option<String>) {
        self.entries.push((count, input.to_string(), output));
    }

    fn row(&self, e: &(i64, String, Option<String>), output: bool) -> Value {
        if output {
            json!([SESSION, e.0, [e.1, e.2]])
        } else {
            json!([SESSION, e.0, e.1])
        }
    }

    /// The `history` list for a request's content.
    pub fn query(&self, content: &Value) -> Vec<Value> {
        let output = content
            .get("output")
            .and_then(Value::as_bool)
            .unwrap_or(false);
        let n = content.get("n").and_then(Value::as_i64);
        let kind = content
            .get("hist_access_type")
            .and_then(Value::as_str)
            .unwrap_or("tail");
        let rows: Vec<&(i64, String, Option<String>)> = match kind {
            "range" => {
                let session = content.get("session").and_then(Value::as_i64).unwrap_or(0);
                if session != 0 && session != SESSION {
                    Vec::new()
                } else {
                    let start = content.get("start").and_then(Value::as_i64).unwrap_or(0);
                    let stop = content.get("stop").and_then(Value::as_i64);
                    self.entries
                        .iter()
                        .filter(|e| e.0 >= start && stop.is_none_or(|s| e.0 < s))
                        .collect()
                }
            }
            "search" => {
                let pattern = content
                    .get("pattern")
                    .and_then(Value::as_str)
                    .unwrap_or("*");
                let unique = content
                    .get("unique")
                    .and_then(Value::as_bool)
                    .unwrap_or(false);
                let mut hits: Vec<&(i64, String, Option<String>)> = Vec::new();
                for e in self.entries.iter().rev() {
                    if glob(pattern, &e.1) && !(unique && hits.iter().any(|h| h.1 == e.1)) {
                        hits.push(e);
                    }
                }
                if let Some(n) = n {
                    hits.truncate(n.max(0) as usize);
                }
                hits.reverse();
                hits
            }
            _ => {
                let take = n.map_or(self.entries.len(), |n| n.max(0) as usize);
                let skip = self.entries.len().saturating_sub(take);
                self.entries[skip..].iter().collect()
            }
        };
        rows.into_iter().map(|e| self.row(e, output)).collect()
    }
}

/// Shell-style glob with `*` (any run) and `?` (one character), matched against the whole text,
/// as IPython's history search does.
fn glob(pattern: &str, text: &str) -> bool {
    let p: Vec<char> = pattern.chars().collect();
    let t: Vec<char> = text.chars().collect();
    let (mut pi, mut ti) = (0, 0);
    let mut star: Option<(usize, usize)> = None;
    while ti < t.len() {
        if pi < p.len() && (p[pi] == '?' || p[pi] == t[ti]) {
            pi += 1;
            ti += 1;
        } else if pi < p.len() && p[pi] == '*' {
            star = Some((pi, ti));
            pi += 1;
        } else if let Some((sp, st)) = star {
            pi = sp + 1;
            ti = st + 1;
            star = Some((sp, st + 1));
        } else {
            return false;
        }
    }
    p[pi..].iter().all(|&c| c == '*')
}

#[cfg(test)]
mod tests {
    use super::*;

    fn sample() -> History {
        let mut h = History::default();
        h.push(1, "let a = 1;", None);
        h.push(2, "a + 1", Some("2".into()));
        h.push(3, "print(a)", None);
        h.push(4, "a + 1", Some("2".into()));
        h
    }

    #[test]
    fn tail_range_and_search() {
        let h = sample();
        let tail = h.query(&json!({"hist_access_type": "tail", "n": 2}));
        assert_eq!(
            tail,
            vec![json!([1, 3, "print(a)"]), json!([1, 4, "a + 1"])]
        );
        let range =
            h.query(&json!({"hist_access_type": "range", "session": 0, "start": 2, "stop": 4}));
        assert_eq!(range.len(), 2);
        let search =
            h.query(&json!({"hist_access_type": "search", "pattern": "a*", "unique": true}));
        assert_eq!(search, vec![json!([1, 4, "a + 1"])]);
        let with_output = h.query(&json!({"hist_access_type": "tail", "n": 1, "output": true}));
        assert_eq!(with_output, vec![json!([1, 4, ["a + 1", "2"]])]);
    }

    #[test]
    fn glob_matches_whole_text() {
        assert!(glob("*", ""));
        assert!(glob("pr?nt*", "print(a)"));
        assert!(!glob("a", "ab"));
        assert!(glob("*b", "aab"));
    }
}
