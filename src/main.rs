//! The `gaugebook` command: a thin shell over [`gaugebook::cli`].

fn main() -> std::process::ExitCode {
    gaugebook::cli::main()
}
