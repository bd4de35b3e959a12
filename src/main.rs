//! The `gaugebook` command: a thin shell over [`gaugebook::cli`].

/// The allocator of the command (and so of the kernel and the script runner): it keeps freed
/// blocks for reuse instead of returning them to the kernel (see `mimalloc` in Cargo.toml).
#[global_allocator]
static ALLOCATOR: mimalloc::MiMalloc = mimalloc::MiMalloc;

fn main() -> std::process::ExitCode {
    gaugebook::cli::main()
}
