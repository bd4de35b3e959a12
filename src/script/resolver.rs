//! `import "name" as m;` resolution: the importing file's folder, the script's own folder, then
//! the stdlib folder. Each module file is compiled with its full path as its source, so an error
//! inside it points at the right file and line, and is evaluated once per session.

use std::collections::HashMap;
use std::path::{Path, PathBuf};
use std::sync::RwLock;

use rhai::{Dynamic, Engine, EvalAltResult, Module, ModuleResolver, Position, Scope, Shared};

use super::error::{Fault, SourceMap};

/// Finds and loads script modules.
pub(crate) struct Resolver {
    dirs: Vec<PathBuf>,
    cache: RwLock<HashMap<PathBuf, Shared<Module>>>,
    sources: SourceMap,
}

impl Resolver {
    pub(crate) fn new(
        script_dir: Option<PathBuf>,
        stdlib_dir: Option<PathBuf>,
        sources: SourceMap,
    ) -> Resolver {
        let dirs = script_dir.into_iter().chain(stdlib_dir).collect();
        Resolver {
            dirs,
            cache: RwLock::new(HashMap::new()),
            sources,
        }
    }

    /// The file an import path names, if it exists.
    pub(crate) fn find(&self, source: Option<&str>, path: &str) -> Option<PathBuf> {
        let mut rel = PathBuf::from(path);
        if rel.extension().is_none() {
            rel.set_extension("rhai");
        }
        if rel.is_absolute() {
            return rel.is_file().then_some(rel);
        }
        let from_source = source
            .map(Path::new)
            .filter(|p| p.is_file())
            .and_then(Path::parent)
            .map(Path::to_path_buf);
        from_source
            .into_iter()
            .chain(self.dirs.iter().cloned())
            .map(|d| d.join(&rel))
            .find(|p| p.is_file())
    }

    /// The folders searched, for messages and completion.
    pub(crate) fn dirs(&self) -> &[PathBuf] {
        &self.dirs
    }

    fn load(
        &self,
        engine: &Engine,
        file: &Path,
        path: &str,
        pos: Position,
    ) -> Result<Shared<Module>, Box<EvalAltResult>> {
        let key = file.canonicalize().unwrap_or_else(|_| file.to_path_buf());
        if let Some(m) = self.cache.read().ok().and_then(|c| c.get(&key).cloned()) {
            return Ok(m);
        }
        let name = file.to_string_lossy().to_string();
        let text = std::fs::read_to_string(file).map_err(|e| {
            runtime(
                pos,
                "ModuleNotFound",
                format!("cannot read module `{path}` from {name}: {e}"),
            )
        })?;
        self.sources.add_text(&name, &text);
        self.sources.add_module(path, &name);
        let in_module = |e: Box<EvalAltResult>| {
            Box::new(EvalAltResult::ErrorInModule(path.to_string(), e, pos))
        };
        let mut ast = engine.compile(&text).map_err(|e| in_module(e.into()))?;
        ast.set_source(name.as_str());
        let mut module = Module::eval_ast_as_new(Scope::new(), &ast, engine).map_err(in_module)?;
        module.set_id(name.as_str());
        module.build_index();
        let shared: Shared<Module> = module.into();
        if let Ok(mut c) = self.cache.write() {
            c.insert(key, shared.clone());
        }
        Ok(shared)
    }
}

fn runtime(pos: Position, kind: &str, message: String) -> Box<EvalAltResult> {
    let f = Fault {
        kind: kind.to_string(),
        message,
    };
    Box::new(EvalAltResult::ErrorRuntime(Dynamic::from(f), pos))
}

impl ModuleResolver for Resolver {
    fn resolve(
        &self,
        engine: &Engine,
        source: Option<&str>,
        path: &str,
        pos: Position,
    ) -> Result<Shared<Module>, Box<EvalAltResult>> {
        match self.find(source, path) {
            Some(file) => self.load(engine, &file, path, pos),
            None => {
                let searched: Vec<String> =
                    self.dirs.iter().map(|d| d.display().to_string()).collect();
                Err(runtime(
                    pos,
                    "ModuleNotFound",
                    format!(
                        "module `{path}` not found (searched {})",
                        if searched.is_empty() {
                            "no folders".to_string()
                        } else {
                            searched.join(", ")
                        }
                    ),
                ))
            }
        }
    }
}

/// The engine's handle on a resolver the session also keeps (to re-resolve imports).
pub(crate) struct ResolverHandle(pub(crate) std::sync::Arc<Resolver>);

impl ModuleResolver for ResolverHandle {
    fn resolve(
        &self,
        engine: &Engine,
        source: Option<&str>,
        path: &str,
        pos: Position,
    ) -> Result<Shared<Module>, Box<EvalAltResult>> {
        self.0.resolve(engine, source, path, pos)
    }
}
