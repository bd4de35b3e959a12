//! The kernelspec: the `kernel.json` and logos that tell Jupyter how to launch this kernel,
//! written where Jupyter looks (jupyter_client's kernelspec search path: the user data folder,
//! `{sys.prefix}/share/jupyter`, or a chosen prefix).

use std::path::{Path, PathBuf};

use serde_json::json;

use super::{KernelError, logo};

/// The kernelspec's folder name, which Jupyter uses as the kernel's name.
///
/// ```
/// assert_eq!(gaugebook::KERNEL_NAME, "gaugebook");
/// ```
pub const KERNEL_NAME: &str = "gaugebook";

/// Where to install the kernelspec.
///
/// ```
/// let t = gaugebook::KernelspecTarget::Prefix("/opt/env".into());
/// assert!(t.kernels_dir().unwrap().ends_with("share/jupyter/kernels"));
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum KernelspecTarget {
    /// The user's Jupyter data folder (`JUPYTER_DATA_DIR`, else the platform default).
    User,
    /// The active Python environment (`VIRTUAL_ENV` or `CONDA_PREFIX`) `/share/jupyter`.
    SysPrefix,
    /// `DIR/share/jupyter`.
    Prefix(PathBuf),
}

impl KernelspecTarget {
    /// The `kernels` folder this target stands for.
    pub fn kernels_dir(&self) -> Result<PathBuf, KernelError> {
        let env = |k: &str| {
            std::env::var_os(k)
                .filter(|v| !v.is_empty())
                .map(PathBuf::from)
        };
        let base = match self {
            KernelspecTarget::Prefix(dir) => dir.join("share").join("jupyter"),
            KernelspecTarget::SysPrefix => env("VIRTUAL_ENV")
                .or_else(|| env("CONDA_PREFIX"))
                .ok_or_else(|| {
                    KernelError::Spec(
                        "expected an active Python environment (VIRTUAL_ENV or CONDA_PREFIX) for --sys-prefix, found none".into(),
                    )
                })?
                .join("share")
                .join("jupyter"),
            KernelspecTarget::User => match env("JUPYTER_DATA_DIR") {
                Some(d) => d,
                None => user_data_dir()?,
            },
        };
        Ok(base.join("kernels"))
    }
}

/// jupyter_core's per-user data folder for this platform.
fn user_data_dir() -> Result<PathBuf, KernelError> {
    let env = |k: &str| {
        std::env::var_os(k)
            .filter(|v| !v.is_empty())
            .map(PathBuf::from)
    };
    let missing =
        |what: &str| KernelError::Spec(format!("expected {what} to be set, found nothing"));
    if cfg!(windows) {
        return Ok(env("APPDATA")
            .ok_or_else(|| missing("APPDATA"))?
            .join("jupyter"));
    }
    let home = env("HOME").ok_or_else(|| missing("HOME"))?;
    if cfg!(target_os = "macos") {
        return Ok(home.join("Library").join("Jupyter"));
    }
    Ok(env("XDG_DATA_HOME")
        .unwrap_or_else(|| home.join(".local").join("share"))
        .join("jupyter"))
}

/// The `kernel.json` text for a launch command (`{connection_file}` is substituted by Jupyter).
pub(crate) fn kernel_json(argv: &[String]) -> String {
    let spec = json!({
        "argv": argv,
        "display_name": "Gaugebook (Rhai)",
        "language": "rhai",
        "interrupt_mode": "message",
        "metadata": {"debugger": false},
    });
    // Pretty-printing a JSON value built from strings cannot fail.
    serde_json::to_string_pretty(&spec).unwrap_or_default() + "\n"
}

/// Installs the kernelspec for this executable (`EXE kernel run {connection_file}`) and returns
/// its folder.
///
/// ```no_run
/// let dir = gaugebook::install_kernelspec(gaugebook::KernelspecTarget::User)?;
/// println!("installed in {}", dir.display());
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
pub fn install_kernelspec(target: KernelspecTarget) -> Result<PathBuf, KernelError> {
    let exe = std::env::current_exe()
        .map_err(|e| KernelError::Spec(format!("cannot find this executable: {e}")))?;
    let argv = vec![
        exe.to_string_lossy().into_owned(),
        "kernel".into(),
        "run".into(),
        "{connection_file}".into(),
    ];
    install_kernelspec_with(target, &argv)
}

/// Installs the kernelspec with an explicit launch command (tests launch a test binary).
///
/// ```
/// let tmp = std::env::temp_dir().join(format!("gb-spec-doc-{}", std::process::id()));
/// let argv = ["my-kernel".to_string(), "{connection_file}".to_string()];
/// let dir = gaugebook::install_kernelspec_with(gaugebook::KernelspecTarget::Prefix(tmp.clone()), &argv)?;
/// assert!(dir.join("kernel.json").exists());
/// assert!(gaugebook::uninstall_kernelspec(gaugebook::KernelspecTarget::Prefix(tmp.clone()))?);
/// # std::fs::remove_dir_all(tmp).ok();
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
pub fn install_kernelspec_with(
    target: KernelspecTarget,
    argv: &[String],
) -> Result<PathBuf, KernelError> {
    let dir = target.kernels_dir()?.join(KERNEL_NAME);
    std::fs::create_dir_all(&dir).map_err(|e| io(&dir, e))?;
    write(&dir.join("kernel.json"), kernel_json(argv).as_bytes())?;
    write(&dir.join("logo-svg.svg"), logo::svg().as_bytes())?;
    write(&dir.join("logo-32x32.png"), &logo::png(32))?;
    write(&dir.join("logo-64x64.png"), &logo::png(64))?;
    Ok(dir)
}

/// Removes the kernelspec from `target`; `Ok(false)` when none was there.
///
/// ```
/// let tmp = std::env::temp_dir().join(format!("gb-unspec-doc-{}", std::process::id()));
/// assert!(!gaugebook::uninstall_kernelspec(gaugebook::KernelspecTarget::Prefix(tmp))?);
/// # Ok::<(), gaugebook::KernelError>(())
/// ```
pub fn uninstall_kernelspec(target: KernelspecTarget) -> Result<bool, KernelError> {
    let dir = target.kernels_dir()?.join(KERNEL_NAME);
    if !dir.exists() {
        return Ok(false);
    }
    std::fs::remove_dir_all(&dir).map_err(|e| io(&dir, e))?;
    Ok(true)
}

fn write(path: &Path, data: &[u8]) -> Result<(), KernelError> {
    std::fs::write(path, data).map_err(|e| io(path, e))
}

fn io(path: &Path, e: std::io::Error) -> KernelError {
    KernelError::Spec(format!("cannot write {}: {e}", path.display()))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn kernel_json_has_the_launch_fields() {
        let text = kernel_json(&[
            "gb".into(),
            "kernel".into(),
            "run".into(),
            "{connection_file}".into(),
        ]);
        let v: serde_json::Value = serde_json::from_str(&text).unwrap();
        assert_eq!(v["language"], "rhai");
        assert_eq!(v["interrupt_mode"], "message");
        assert_eq!(v["argv"][3], "{connection_file}");
    }

    #[test]
    fn install_then_uninstall_in_a_prefix() {
        let tmp = tempfile::tempdir().unwrap();
        let target = KernelspecTarget::Prefix(tmp.path().to_path_buf());
        let dir = install_kernelspec_with(target.clone(), &["x".into()]).unwrap();
        assert_eq!(dir, tmp.path().join("share/jupyter/kernels/gaugebook"));
        for f in [
            "kernel.json",
            "logo-svg.svg",
            "logo-32x32.png",
            "logo-64x64.png",
        ] {
            assert!(dir.join(f).is_file(), "{f}");
        }
        assert!(uninstall_kernelspec(target.clone()).unwrap());
        assert!(!uninstall_kernelspec(target).unwrap());
    }
}
