//! Test-log import, export and conversion; the catalogue of malformed logs.
//!
//! Every malformed log is generated into a temporary folder by the test itself. Rows are
//! 1-based with the header as row 1 (as a text editor numbers lines); columns are 1-based.

#![cfg(feature = "data")]

use std::path::{Path, PathBuf};

use gaugebook::{
    Arrangement, DataError, ExportOptions, LogFormat, LogOptions, open_log, ratio_to_strain,
    read_log, write_columns, write_log,
};

use crate::common::assert_close;

fn write(dir: &Path, name: &str, text: &str) -> PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, text).unwrap();
    p
}

fn err(path: &Path, opts: &LogOptions) -> DataError {
    match read_log(path, opts) {
        Ok(log) => panic!("expected an error, read {} rows", log.rows()),
        Err(e) => e,
    }
}

/// Every error message names the file.
fn names_file(e: &DataError, path: &Path) {
    let name = path.file_name().unwrap().to_str().unwrap();
    assert!(
        e.to_string().contains(name),
        "message without the file name: {e}"
    );
}

// ---------------------------------------------------------------------------------------------
// Catalogue of malformed logs

#[test]
fn ragged_row_with_too_many_fields() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "ragged.csv",
        "time,a,b\n0,1,2\n1,1,2\n2,1,2,9\n3,1,2\n",
    );
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(
            e,
            DataError::Ragged {
                row: 4,
                expected: 3,
                found: 4,
                ..
            }
        ),
        "{e}"
    );
    names_file(&e, &p);
}

#[test]
fn ragged_row_with_too_few_fields() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "short.csv", "time,a,b\n0,1,2\n1,1\n2,1,2\n");
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(
            e,
            DataError::Ragged {
                row: 3,
                expected: 3,
                found: 2,
                ..
            }
        ),
        "{e}"
    );
}

#[test]
fn text_in_a_number_column() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "text.csv",
        "time_s,sg1_mVV,load_N\n0,0.1,5\n0.001,0.2,6\n0.002,n/a,7\n",
    );
    let e = err(&p, &LogOptions::new());
    match &e {
        DataError::NotANumber {
            row,
            column,
            name,
            found,
            ..
        } => {
            assert_eq!(
                (*row, *column, name.as_str(), found.as_str()),
                (4, 2, "sg1_mVV", "n/a")
            );
        }
        other => panic!("expected NotANumber, found {other}"),
    }
    assert_eq!((e.row(), e.column()), (Some(4), Some(2)));
    names_file(&e, &p);
    // A column not kept is not parsed, so the same file reads without it.
    let log = read_log(&p, &LogOptions::new().keep(["load_N"])).unwrap();
    assert_eq!(log.channel("load").unwrap().values, vec![5.0, 6.0, 7.0]);
}

#[test]
fn empty_field_is_not_a_number() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "hole.csv", "a,b\n1,2\n3,\n");
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(&e, DataError::NotANumber { row: 3, column: 2, found, .. } if found.is_empty()),
        "{e}"
    );
}

#[test]
fn empty_file_and_blank_file() {
    let d = tempfile::tempdir().unwrap();
    for (name, text) in [("empty.csv", ""), ("blank.csv", "\n\n  \n")] {
        let p = write(d.path(), name, text);
        let e = err(&p, &LogOptions::new());
        assert!(matches!(e, DataError::Empty { .. }), "{name}: {e}");
        names_file(&e, &p);
    }
}

#[test]
fn header_only() {
    let d = tempfile::tempdir().unwrap();
    for (name, text) in [("h1.csv", "time,a,b\n"), ("h2.csv", "time,a,b")] {
        let p = write(d.path(), name, text);
        let e = err(&p, &LogOptions::new());
        assert!(matches!(e, DataError::NoRows { .. }), "{name}: {e}");
    }
    // A Parquet file written with no rows is a whole file (schema, no row groups) and reads as
    // a header without rows, not as a damaged file.
    let p = d.path().join("h.parquet");
    write_columns(&p, &[("time", &[]), ("a", &[])], &ExportOptions::default()).unwrap();
    let e = err(&p, &LogOptions::new());
    assert!(matches!(e, DataError::NoRows { .. }), "h.parquet: {e}");
}

#[test]
fn duplicate_column_names() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "dup.csv",
        "time,load [kN],sg1,load [kN]\n0,1,2,3\n",
    );
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(&e, DataError::DuplicateColumn { first: 2, second: 4, name, .. } if name == "load [kN]"),
        "{e}"
    );
    assert_eq!(e.row(), Some(1));
    names_file(&e, &p);
}

#[test]
fn unknown_unit_in_a_header() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "unit.csv", "time,load [kilobananas],sg1\n0,1,2\n");
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(&e, DataError::UnknownUnit { column: 2, .. }),
        "{e}"
    );
    assert!(e.to_string().contains("kilobananas"), "{e}");
    names_file(&e, &p);
    // Policy: a column that is not kept is not judged; the unit map overrides the header.
    assert!(read_log(&p, &LogOptions::new().keep(["sg1"])).is_ok());
    let log = read_log(&p, &LogOptions::new().unit("load", "kN")).unwrap();
    assert_eq!(log.channel("load").unwrap().unit.symbol(), "kN");
    // An unknown unit in the map is an error naming the column too.
    let e = err(&p, &LogOptions::new().unit("sg1", "furlongs"));
    assert!(matches!(e, DataError::UnknownUnit { column: 3, .. }), "{e}");
}

#[test]
fn nan_and_infinities_are_errors_by_default() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "nan.csv",
        "time,a,b\n0,1,2\n1,NaN,2\n2,1,inf\n3,-inf,2\n4,1,2\n",
    );
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(&e, DataError::NonFinite { row: 3, column: 2, value, .. } if value.is_nan()),
        "{e}"
    );
    names_file(&e, &p);
}

#[test]
fn nan_rows_reported_and_skipped_when_asked() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "nan.csv",
        "time,a,b\n0,1,2\n1,NaN,2\n2,1,inf\n3,-inf,2\n4,5,6\n",
    );
    let log = read_log(&p, &LogOptions::new().skip_nan(true)).unwrap();
    assert_eq!(log.rows(), 2);
    assert_eq!(log.channel("a").unwrap().values, vec![1.0, 5.0]);
    assert_eq!(log.time.as_ref().unwrap().channel.values, vec![0.0, 4.0]);
    let rows: Vec<(usize, usize)> = log.skipped.iter().map(|s| (s.row, s.column)).collect();
    assert_eq!(rows, vec![(3, 2), (4, 3), (5, 2)]);
    assert!(log.skipped[1].value == f64::INFINITY && log.skipped[2].value == f64::NEG_INFINITY);
    // The skipped rows open a gap of 4 s (from 0 s to 4 s, median step 4 s: none beyond it).
    assert_eq!(log.time.as_ref().unwrap().step, 4.0);
}

#[test]
fn non_monotonic_time() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "back.csv",
        "time,a\n0.0,1\n0.1,1\n0.2,1\n0.15,1\n0.3,1\n",
    );
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(&e, DataError::TimeNotIncreasing { row: 5, column: 1, previous, found, .. } if *previous == 0.2 && *found == 0.15),
        "{e}"
    );
    // A repeated time is not an increase either.
    let p = write(d.path(), "same.csv", "time,a\n0.0,1\n0.1,1\n0.1,1\n");
    assert!(matches!(
        err(&p, &LogOptions::new()),
        DataError::TimeNotIncreasing { row: 4, .. }
    ));
}

#[test]
fn truncated_parquet_file() {
    let d = tempfile::tempdir().unwrap();
    let good = d.path().join("good.parquet");
    let t: Vec<f64> = (0..5000).map(|i| i as f64 * 1e-3).collect();
    let v: Vec<f64> = (0..5000).map(|i| (i as f64).sin()).collect();
    write_columns(&good, &[("time", &t), ("a", &v)], &ExportOptions::default()).unwrap();
    let bytes = std::fs::read(&good).unwrap();
    for cut in [bytes.len() / 2, bytes.len() - 3, 6] {
        let p = d.path().join(format!("cut{cut}.parquet"));
        std::fs::write(&p, &bytes[..cut]).unwrap();
        let e = err(&p, &LogOptions::new());
        assert!(matches!(e, DataError::Parquet { .. }), "cut at {cut}: {e}");
        names_file(&e, &p);
    }
    // Policy: an empty .parquet file is Empty, like an empty CSV file.
    let p = d.path().join("zero.parquet");
    std::fs::write(&p, b"").unwrap();
    assert!(matches!(
        err(&p, &LogOptions::new()),
        DataError::Empty { .. }
    ));
}

#[test]
fn unsupported_extension_and_missing_file() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "log.xlsx", "x");
    assert!(matches!(
        err(&p, &LogOptions::new()),
        DataError::UnsupportedFormat { .. }
    ));
    let e = err(&d.path().join("nope.csv"), &LogOptions::new());
    assert!(matches!(e, DataError::Io { .. }), "{e}");
    assert!(e.to_string().contains("nope.csv"));
}

#[test]
fn missing_column_names_what_exists() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "a.csv", "time,a\n0,1\n");
    let e = err(&p, &LogOptions::new().keep(["b"]));
    assert!(
        e.to_string().contains("no column `b`") && e.to_string().contains("time, a"),
        "{e}"
    );
}

#[test]
fn errors_deep_in_the_file_name_the_right_row_across_blocks() {
    // Blocks of 4 KiB: the bad line lies many blocks in, after a blank line.
    let d = tempfile::tempdir().unwrap();
    let mut text = String::from("time,a,b\n");
    for i in 0..20_000 {
        if i == 15_000 {
            text.push('\n');
        }
        if i == 17_345 {
            text.push_str(&format!("{},1.5,oops\n", i));
        } else {
            text.push_str(&format!("{},1.5,2.5\n", i));
        }
    }
    let p = write(d.path(), "long.csv", &text);
    let opts = LogOptions {
        block_bytes: 4096,
        ..LogOptions::new()
    };
    let e = err(&p, &opts);
    // Data row i sits on line i + 2, plus one for the blank line before row 15 000.
    assert!(
        matches!(
            &e,
            DataError::NotANumber {
                row: 17_348,
                column: 3,
                ..
            }
        ),
        "{e}"
    );
}

#[test]
fn a_stray_carriage_return_inside_a_line_is_not_a_number() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "cr.csv", "a,b\n1,2\n3\r4,5\n");
    let e = err(&p, &LogOptions::new());
    assert!(
        matches!(
            &e,
            DataError::NotANumber {
                row: 3,
                column: 1,
                ..
            }
        ),
        "{e}"
    );
}

// ---------------------------------------------------------------------------------------------
// Field forms (policy: whatever Rust's `f64::from_str` reads, after trimming white space and
// surrounding quotes; lines end in LF or CR LF; separators `,` `;` or tab from the header)

#[test]
fn numbers_in_every_written_form_read_as_the_standard_parser_reads_them() {
    let d = tempfile::tempdir().unwrap();
    let fields = [
        "1.5",
        "-0.000",
        "+2",
        "1e-3",
        "-4.2E+2",
        " 7.25 ",
        "\"8.5\"",
        ".5",
        "5.",
        "0.1",
        "123456789012345678901234",
        "9007199254740993",
        "1.7976931348623157e308",
    ];
    let mut text = String::from("x;y\r\n");
    for f in fields {
        text.push_str(&format!("{f};1\r\n"));
    }
    let p = write(d.path(), "forms.csv", &text);
    let log = read_log(&p, &LogOptions::new()).unwrap();
    let got = &log.channel("x").unwrap().values;
    // The reference is Rust's own correctly rounded parser (core::num::dec2flt).
    let want: Vec<f64> = fields
        .iter()
        .map(|f| f.trim().trim_matches('"').parse::<f64>().unwrap())
        .collect();
    let bits = |v: &[f64]| v.iter().map(|x| x.to_bits()).collect::<Vec<_>>();
    assert_eq!(bits(got), bits(&want));
    assert_eq!(log.channel("y").unwrap().values, vec![1.0; fields.len()]);
}

#[test]
fn a_generated_log_reads_bit_for_bit_as_the_standard_parser_reads_it() {
    // Decimals of 0 to 9 fraction digits and up to 12 integer digits, both signs, across many
    // 4 KiB blocks (so lines are cut at block ends too), against `f64::from_str`.
    let d = tempfile::tempdir().unwrap();
    let mut s: u64 = 7;
    let mut next = || {
        // Knuth's MMIX linear congruential constants (from memory): variety, not quality.
        s = s
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        s >> 16
    };
    let mut text = String::from("a,b,c\n");
    let mut want = [Vec::new(), Vec::new(), Vec::new()];
    for _ in 0..30_000 {
        for (k, w) in want.iter_mut().enumerate() {
            let frac = (next() % 10) as usize;
            let int = next() % 10u64.pow((next() % 13) as u32);
            let mut f = if next() % 2 == 0 {
                format!("-{int}")
            } else {
                int.to_string()
            };
            if frac > 0 {
                f.push('.');
                for _ in 0..frac {
                    f.push(char::from(b'0' + (next() % 10) as u8));
                }
            }
            w.push(f.parse::<f64>().unwrap());
            text.push_str(&f);
            text.push(if k == 2 { '\n' } else { ',' });
        }
    }
    let p = write(d.path(), "gen.csv", &text);
    let opts = LogOptions {
        block_bytes: 4096,
        ..LogOptions::new()
    };
    let log = read_log(&p, &opts).unwrap();
    for (name, w) in ["a", "b", "c"].iter().zip(&want) {
        let got = &log.channel(name).unwrap().values;
        assert_eq!(got.len(), w.len());
        let diff = got
            .iter()
            .zip(w)
            .position(|(g, w)| g.to_bits() != w.to_bits());
        assert_eq!(diff, None, "column {name}");
    }
}

#[test]
fn tab_and_semicolon_separators_and_a_last_line_without_its_line_end() {
    let d = tempfile::tempdir().unwrap();
    for (name, text) in [
        ("tab.csv", "t\tv\n0\t1.5\n1\t2.5"),
        ("semi.csv", "t;v\r\n0;1.5\r\n1;2.5"),
    ] {
        let p = write(d.path(), name, text);
        let log = read_log(&p, &LogOptions::new()).unwrap();
        assert_eq!(log.channel("v").unwrap().values, vec![1.5, 2.5], "{name}");
    }
}

// ---------------------------------------------------------------------------------------------
// Reading

#[test]
fn units_from_headers_in_every_form_and_the_override_map() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "units.csv",
        "t,load [kN],force (N),sg1_mVV,strain_ue,ch5\n0,1,2,3,4,5\n1,1,2,3,4,5\n",
    );
    let log = read_log(&p, &LogOptions::new().unit("ch5", "mV/V")).unwrap();
    let sym = |n: &str| log.channel(n).unwrap().unit.symbol().to_string();
    assert_eq!(sym("load"), "kN");
    assert_eq!(sym("force"), "N");
    assert_eq!(sym("sg1"), "mV/V");
    assert_eq!(sym("strain"), "µε");
    assert_eq!(sym("ch5"), "mV/V");
    // "t" is taken as the time axis, in seconds when no unit is stated.
    assert_eq!(log.time.as_ref().unwrap().channel.name, "t");
    assert_eq!(
        log.names(),
        vec!["t", "load", "force", "sg1", "strain", "ch5"]
    );
    assert_eq!(log.channel("load").unwrap().column, 2);
}

#[test]
fn the_bench_log_headers() {
    // The columns of ../shared/bench/gen_testlog.py.
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "bench.csv",
        "time_s,sg1_mVV,temp_C,load_ref_N\n0.000,0.052,23.000,0.00\n0.001,0.053,23.001,1.50\n",
    );
    let log = read_log(&p, &LogOptions::new()).unwrap();
    let t = log.time.as_ref().unwrap();
    assert_eq!(
        (t.channel.name.as_str(), t.channel.unit.symbol()),
        ("time", "s")
    );
    assert_close(t.sample_rate_hz, 1000.0, 1e-9, 0.0);
    let temp = log.channel("temp").unwrap();
    assert_eq!(temp.unit.kind(), gaugebook::Kind::AbsoluteTemperature);
    // 23 °C = 296.15 K (SI Brochure, 9th ed., 2.3.1: t/°C = T/K − 273.15).
    assert_close(temp.si_values()[0], 296.15, 1e-12, 0.0);
    assert_eq!(log.channel("load_ref").unwrap().unit.symbol(), "N");
}

#[test]
fn values_are_the_correctly_rounded_doubles() {
    // Reference: Rust's f64 FromStr is correctly rounded (IEEE 754 round to nearest), as is
    // Python's float(); the reader must give the same bits.
    let d = tempfile::tempdir().unwrap();
    let texts = [
        "0.1",
        "-0.000123",
        "1e-7",
        "123456.789012",
        "2.2250738585072014e-308",
        "0.30000000000000004",
    ];
    let body: String = texts.iter().map(|t| format!("{t}\n")).collect();
    let p = write(d.path(), "bits.csv", &format!("x\n{body}"));
    let log = read_log(&p, &LogOptions::new()).unwrap();
    let expected: Vec<f64> = texts.iter().map(|t| t.parse().unwrap()).collect();
    assert_eq!(log.channel("x").unwrap().values, expected);
}

#[test]
fn sample_rate_and_gaps() {
    let d = tempfile::tempdir().unwrap();
    let mut text = String::from("time,a\n");
    let mut t = 0.0;
    for i in 0..1000 {
        // A lost stretch after sample 400: 0.25 s instead of 0.002 s.
        t += if i == 401 { 0.25 } else { 0.002 };
        text.push_str(&format!("{t:.3},{i}\n"));
    }
    let p = write(d.path(), "rate.csv", &text);
    let log = read_log(&p, &LogOptions::new()).unwrap();
    let tax = log.time.as_ref().unwrap();
    assert_close(tax.sample_rate_hz, 500.0, 1e-9, 0.0);
    assert_eq!(tax.gaps.len(), 1);
    // Sample 401 (0-based) is data row 402, file row 403.
    assert_eq!(tax.gaps[0].row, 403);
    assert_close(tax.gaps[0].length, 0.25, 1e-9, 0.0);
}

#[test]
fn iso_timestamps_as_time_axis() {
    let d = tempfile::tempdir().unwrap();
    let p = write(
        d.path(),
        "ts.csv",
        "timestamp,load_N\n2026-12-01T20:00:00.000Z,1\n2026-12-01T20:00:00.010Z,2\n2026-12-01T20:00:00.020Z,3\n",
    );
    let log = read_log(&p, &LogOptions::new()).unwrap();
    let t = log.time.as_ref().unwrap();
    // 2026-12-01T20:00:00Z = 1796155200 s after the epoch (date -u -d ... +%s, GNU coreutils).
    assert_eq!(t.start_unix_s, Some(1_796_155_200.0));
    assert_close(t.channel.values[2], 0.02, 1e-9, 0.0);
    assert_close(t.sample_rate_hz, 100.0, 1e-6, 0.0);
    let p = write(
        d.path(),
        "ts_bad.csv",
        "timestamp,load_N\n2026-12-01T20:00:00Z,1\nlater,2\n",
    );
    assert!(matches!(
        err(&p, &LogOptions::new()),
        DataError::BadTimestamp {
            row: 3,
            column: 1,
            ..
        }
    ));
}

#[test]
fn projection_keeps_only_the_columns_asked_for() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "p.csv", "time,a,b,c\n0,1,2,x\n1,3,4,y\n");
    let log = read_log(&p, &LogOptions::new().keep(["b", "a"])).unwrap();
    assert_eq!(log.names(), vec!["time", "b", "a"]);
    assert_eq!(log.channel("b").unwrap().values, vec![2.0, 4.0]);
}

#[test]
fn semicolon_and_crlf_files() {
    let d = tempfile::tempdir().unwrap();
    let p = write(d.path(), "semi.csv", "time;load [kN]\r\n0;1.5\r\n1;2.5\r\n");
    let log = read_log(&p, &LogOptions::new()).unwrap();
    assert_eq!(log.channel("load").unwrap().values, vec![1.5, 2.5]);
}

#[test]
fn streaming_yields_the_same_values_as_the_whole_read() {
    let d = tempfile::tempdir().unwrap();
    let mut text = String::from("time,x\n");
    for i in 0..5000 {
        text.push_str(&format!("{},{}\n", i, i * 3));
    }
    let p = write(d.path(), "s.csv", &text);
    let opts = LogOptions {
        block_bytes: 4096,
        ..LogOptions::new()
    };
    let mut n = 0;
    let mut chunks = 0;
    for c in open_log(&p, &opts).unwrap() {
        let c = c.unwrap();
        assert_eq!(c.first_row, n + 2);
        for (k, v) in c.channels[0].iter().enumerate() {
            assert_eq!(*v, ((n + k) * 3) as f64);
        }
        n += c.len();
        chunks += 1;
    }
    assert_eq!(n, 5000);
    assert!(chunks > 5);
}

#[test]
fn parquet_round_trip_and_projection() {
    let d = tempfile::tempdir().unwrap();
    let p = d.path().join("r.parquet");
    let t: Vec<f64> = (0..3000).map(|i| i as f64 * 0.001).collect();
    let a: Vec<f64> = (0..3000).map(|i| (i as f64 * 0.01).cos()).collect();
    let b: Vec<f64> = (0..3000).map(|i| i as f64).collect();
    write_columns(
        &p,
        &[("time_s", &t), ("sg1_mVV", &a), ("load_N", &b)],
        &ExportOptions::default(),
    )
    .unwrap();
    let opts = LogOptions {
        block_bytes: 8 * 1024 * 2,
        ..LogOptions::new().keep(["sg1"])
    };
    let log = read_log(&p, &opts).unwrap();
    assert_eq!(log.format, LogFormat::Parquet);
    assert_eq!(log.names(), vec!["time", "sg1"]);
    assert_eq!(log.channel("sg1").unwrap().values, a);
    assert_eq!(log.channel("sg1").unwrap().unit.symbol(), "mV/V");
}

// ---------------------------------------------------------------------------------------------
// Export

#[test]
fn csv_export_matches_c_printf_and_reads_back() {
    let d = tempfile::tempdir().unwrap();
    let p = d.path().join("o.csv");
    let x = [0.03125, -0.00004, 1234.56785, -7.0];
    write_columns(
        &p,
        &[("x", &x)],
        &ExportOptions {
            decimals: Some(4),
            ..Default::default()
        },
    )
    .unwrap();
    // Python 3.11.7 "%.4f" % x (C printf rules): 0.0312 (an exact tie, half to even), -0.0000,
    // 1234.5678 (1234.56785 is stored as 1234.5678499999999...), -7.0000.
    assert_eq!(
        std::fs::read_to_string(&p).unwrap(),
        "x\n0.0312\n-0.0000\n1234.5678\n-7.0000\n"
    );
}

#[test]
fn export_is_atomic_and_never_touches_the_input() {
    let d = tempfile::tempdir().unwrap();
    let src = write(d.path(), "in.csv", "time,a\n0,1\n1,2\n");
    let before = std::fs::read(&src).unwrap();
    let log = read_log(&src, &LogOptions::new()).unwrap();
    let e = write_log(&log, &src, &ExportOptions::default()).unwrap_err();
    assert!(matches!(e, DataError::WouldOverwriteInput { .. }), "{e}");
    assert_eq!(std::fs::read(&src).unwrap(), before);
    // A failing rename (the target is a folder) leaves no temporary file behind.
    let target = d.path().join("out.csv");
    std::fs::create_dir(&target).unwrap();
    assert!(write_log(&log, &target, &ExportOptions::default()).is_err());
    let names: Vec<String> = std::fs::read_dir(d.path())
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect();
    assert!(
        names.iter().all(|n| !n.ends_with(".tmp")),
        "left behind: {names:?}"
    );
    // Lengths that differ are refused before anything is created.
    let e = write_columns(
        d.path().join("x.csv"),
        &[("a", &[1.0]), ("b", &[1.0, 2.0])],
        &ExportOptions::default(),
    )
    .unwrap_err();
    assert!(matches!(e, DataError::LengthMismatch { .. }));
    assert!(!d.path().join("x.csv").exists());
}

// ---------------------------------------------------------------------------------------------
// Conversion

#[test]
fn quarter_bridge_inverse_matches_the_peer_formula() {
    // ../shared/bench/peer_reanalysis.py bridge_strain: eps = 4 r / (GF (1 - 2 r)), r = mVV/1000.
    let mvv = [-1.2, -0.074, 0.0, 0.052, 1.0312, 2.5];
    let r: Vec<f64> = mvv.iter().map(|m| m * 1e-3).collect();
    let e = ratio_to_strain(&r, Arrangement::Quarter, 2.10, 0.3).unwrap();
    for (ri, ei) in r.iter().zip(e) {
        let peer = 4.0 * ri / (2.10 * (1.0 - 2.0 * ri));
        assert_close(ei, peer, 1e-15, 1e-21);
    }
}
