//! The command line: parse arguments, call the library, map outcomes to exit statuses
//! (0 all checks pass / intact, 1 a check fails / changed, 2 bad input or error).

use clap::{Parser, Subcommand, ValueEnum};
use std::path::PathBuf;
use std::process::ExitCode;
use strainsheet::integrity::{diff, sidecar, sign, verify};
use strainsheet::{Error, analysis, input, integrity, output, present, report, starter};

/// mimalloc: the typesetter and the TOML reader make many small allocations; with it
/// `check --json` on 3,000 members takes 0.028 s where the system allocator takes 0.040 s.
#[global_allocator]
static ALLOC: mimalloc::MiMalloc = mimalloc::MiMalloc;

#[derive(Parser)]
#[command(
    name = "strainsheet",
    version,
    about = "Flexural strength of pretensioned concrete members by strain compatibility, \
             written up as a paginated, signed-off PDF calculation package.",
    after_help = "Exit status: 0 every check passes (verify: intact), 1 a check fails (verify: changed), 2 bad input \
                  or error, 3 check and report: every check passes but only on open conditions (listed by check, \
                  e.g. a waiver that rests on a shear check not made here); verify: NOT VERIFIED, its pages could \
                  not be compared (made by another version, or its template folder not given). Two hashes: the \
                  content hash (payload), on the cover, and the file hash (PDF), in OUT.pdf.sha256."
)]
struct Cli {
    #[command(subcommand)]
    cmd: Cmd,
}

/// Bounds on typesetting, so that a template folder that loops or grows without end
/// stops with a message instead of holding the machine. The defaults are far beyond
/// any real package here (500 members: about 70 s and 2.5 GB).
#[derive(clap::Args, Clone, Copy)]
struct Bounds {
    /// Stop typesetting after this many seconds.
    #[arg(long, value_name = "SECONDS", default_value_t = 900)]
    time_limit: u64,
    /// Stop when the process holds more than this many megabytes.
    #[arg(long, value_name = "MB", default_value_t = 12_000)]
    memory_limit: u64,
}

/// The most members `report` typesets in one package (a member takes about 8 sheets,
/// 0.14 s and 5 MB here); a larger project is split into packages.
const REPORT_MEMBERS: usize = 500;

/// Watches the time and the memory of the typesetting from another thread; past a
/// bound it says which and why, removes what was being written and ends the process
/// with status 2. Typst cannot be stopped in the middle of a layout, so the process
/// is.
fn watchdog(bounds: Bounds, templates: Option<&std::path::Path>) {
    let started = std::time::Instant::now();
    let folder = templates.map(|d| format!(" (the template folder {} may loop or grow without end)", d.display()));
    std::thread::spawn(move || {
        loop {
            std::thread::sleep(std::time::Duration::from_millis(100));
            let over = if started.elapsed().as_secs() >= bounds.time_limit {
                Some(format!("typesetting did not finish within {} s", bounds.time_limit))
            } else {
                resident_mb()
                    .filter(|mb| *mb > bounds.memory_limit)
                    .map(|mb| format!("typesetting took {mb} MB, beyond {} MB", bounds.memory_limit))
            };
            if let Some(what) = over {
                let written = output::remove_pending();
                eprintln!(
                    "error: {what}{}; raise --time-limit or --memory-limit for a package that needs more. {written}.",
                    folder.clone().unwrap_or_default()
                );
                std::process::exit(2);
            }
        }
    });
}

/// The process's resident memory in megabytes (Linux; elsewhere not watched).
fn resident_mb() -> Option<u64> {
    let status = std::fs::read_to_string("/proc/self/statm").ok()?;
    let pages: u64 = status.split_whitespace().nth(1)?.parse().ok()?;
    Some(pages * 4096 / (1024 * 1024))
}

#[derive(Clone, Copy, ValueEnum)]
enum Units {
    Us,
    Si,
}

#[derive(Clone, Copy, ValueEnum)]
enum TraceFormat {
    Text,
    Json,
    Csv,
}

#[derive(Clone, Copy, ValueEnum)]
enum CurveFormat {
    Json,
    Csv,
}

#[derive(Subcommand)]
enum Cmd {
    /// Write a commented starter input file.
    New {
        file: PathBuf,
        /// Unit system of the starter.
        #[arg(long, value_enum, default_value = "us")]
        units: Units,
        /// Replace the file if it exists.
        #[arg(long)]
        overwrite: bool,
    },
    /// Analyse every member and print a summary (exit 0 all pass, 1 a check fails, 3 all
    /// pass only on the open conditions listed).
    Check {
        file: PathBuf,
        /// Print JSON on stdout instead of the table.
        #[arg(long)]
        json: bool,
    },
    /// Write the calculation package (PDF/A-3b) and its sidecar OUT.pdf.sha256, which holds
    /// the file hash (PDF) for `sha256sum -c`; the cover shows the content hash (payload).
    Report {
        file: PathBuf,
        /// Output file (default: the input's name with .pdf).
        #[arg(short, long)]
        output: Option<PathBuf>,
        /// Replace existing output files.
        #[arg(long)]
        overwrite: bool,
        /// Use the templates in this folder instead of the built-in ones (it must hold
        /// package.typ, members.typ and sheet-numbers.typ; start from a copy of the
        /// built-in templates/ folder).
        #[arg(long, value_name = "DIR")]
        templates: Option<PathBuf>,
        #[command(flatten)]
        bounds: Bounds,
    },
    /// Prove a package unchanged: content hash (payload), re-analysis, byte-identical
    /// re-render, the sidecar's file hash (PDF), (with --pubkey) the file signature and
    /// (with --expect) a hash recorded at issue. Exit 0 intact, 1 changed (or the
    /// signature or the expected hash fails), 2 not a package or unreadable, 3 NOT
    /// VERIFIED: its pages could not be compared with its content (made by another
    /// version, or its template folder not given); --expect with the file hash proves
    /// such a file.
    Verify {
        file: PathBuf,
        /// The template folder the package was made with (if not the built-in one).
        #[arg(long, value_name = "DIR")]
        templates: Option<PathBuf>,
        /// Also check FILE.sig against this public key.
        #[arg(long, value_name = "KEY.pub")]
        pubkey: Option<PathBuf>,
        /// A hash recorded at issue: the file hash (PDF, as in the .sha256 sidecar) or the
        /// content hash (payload, as on the cover); any difference fails (exit 1). The file
        /// hash proves a package of any version.
        #[arg(long, value_name = "HASH")]
        expect: Option<String>,
        #[command(flatten)]
        bounds: Bounds,
    },
    /// Write an Ed25519 key pair for signing packages: KEY (private, mode 0600) and
    /// KEY.pub. A file signature proves who issued a file; it is not a professional seal
    /// under a licensing board's digital-signature rules.
    Keygen {
        /// Private key file to write (the public key goes to KEY.pub).
        #[arg(short, long, value_name = "KEY")]
        output: PathBuf,
        /// The signer's name, as it should appear in signatures.
        #[arg(long)]
        name: String,
        /// The signer's license number.
        #[arg(long)]
        license: String,
    },
    /// Sign a package file: writes FILE.sig (signer, license, date, file hash (PDF),
    /// signature). A DRAFT (a sign-off undated) is refused unless --draft is given. It
    /// complements, never replaces, the sign-off block inside the package, and is not a
    /// professional seal under a licensing board's digital-signature rules.
    Sign {
        file: PathBuf,
        /// The private key written by `keygen`.
        #[arg(long, value_name = "KEY")]
        key: PathBuf,
        /// Date to record (default: today, UTC).
        #[arg(long)]
        date: Option<String>,
        /// Replace an existing FILE.sig.
        #[arg(long)]
        overwrite: bool,
        /// Sign a DRAFT package (not every sign-off dated); the signature records that it
        /// is of a draft.
        #[arg(long)]
        draft: bool,
    },
    /// Compare two packages, two TOML inputs (analysed here, as check does) or one of
    /// each: inputs changed (in the package's units), members and locations added or
    /// removed (matched by id and name), and the changed results of each location (phi
    /// Mn, Mu/phi Mn, Mcr, 1.2 Mcr, phi, status...).
    Diff {
        old: PathBuf,
        new: PathBuf,
        /// Print JSON instead of the table.
        #[arg(long)]
        json: bool,
    },
    /// The moment-curvature response of a member (fibre analysis), as JSON or CSV.
    Curve {
        file: PathBuf,
        /// The member (may be left out when the file has one member).
        #[arg(long)]
        member: Option<String>,
        /// Check location (default: the member's governing location).
        #[arg(long)]
        location: Option<String>,
        #[arg(long, value_enum, default_value = "json")]
        format: CurveFormat,
    },
    /// Print every recorded step of the computation, for review.
    Trace {
        file: PathBuf,
        /// Only this member.
        #[arg(long)]
        member: Option<String>,
        #[arg(long, value_enum, default_value = "text")]
        format: TraceFormat,
    },
}

/// A spinner with the current phase on stderr, shown only when stderr is a terminal.
struct Progress(Option<indicatif::ProgressBar>);

impl Progress {
    fn new() -> Progress {
        use std::io::IsTerminal;
        if !std::io::stderr().is_terminal() {
            return Progress(None);
        }
        let pb = indicatif::ProgressBar::new_spinner();
        pb.enable_steady_tick(std::time::Duration::from_millis(120));
        Progress(Some(pb))
    }
    fn phase(&self, msg: impl Into<String>) {
        if let Some(pb) = &self.0 {
            pb.set_message(msg.into());
        }
    }
    fn done(&self) {
        if let Some(pb) = &self.0 {
            pb.finish_and_clear();
        }
    }
}

impl Drop for Progress {
    fn drop(&mut self) {
        self.done();
    }
}

/// Writes to stdout through one buffer; a closed pipe is not an error.
fn write_stdout(f: impl FnOnce(&mut dyn std::io::Write) -> std::io::Result<()>) -> Result<(), Error> {
    use std::io::Write;
    let mut w = std::io::BufWriter::with_capacity(1 << 16, std::io::stdout().lock());
    match f(&mut w).and_then(|_| w.flush()) {
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => Ok(()),
        Err(e) => Err(Error::Io { path: "stdout".into(), message: e.to_string() }),
        Ok(()) => Ok(()),
    }
}

fn run(cli: Cli) -> Result<ExitCode, Error> {
    match cli.cmd {
        Cmd::New { file, units, overwrite } => {
            let text = match units {
                Units::Us => starter::US,
                Units::Si => starter::SI,
            };
            output::write_all(&[(file.clone(), text.as_bytes().to_vec())], overwrite)?;
            eprintln!("wrote {}: edit it, then run `strainsheet check {}`", file.display(), file.display());
            Ok(ExitCode::SUCCESS)
        }
        Cmd::Check { file, json } => check_cmd(file, json),
        Cmd::Report { file, output, overwrite, templates, bounds } => {
            report_cmd(file, output, overwrite, templates, bounds)
        }
        Cmd::Verify { file, templates, pubkey, expect, bounds } => verify_cmd(file, templates, pubkey, expect, bounds),
        Cmd::Keygen { output, name, license } => {
            let public = sign::keygen(&output, &name, &license)?;
            eprintln!(
                "wrote {} (private, keep it secret) and {} (public, share it)",
                output.display(),
                public.display()
            );
            Ok(ExitCode::SUCCESS)
        }
        Cmd::Sign { file, key, date, overwrite, draft } => {
            let signed = sign::sign(&file, &key, date.as_deref(), overwrite, draft)?;
            if signed.draft {
                eprintln!(
                    "warning: {} is a DRAFT (not every sign-off is dated); the signature records that it is of a draft",
                    file.display()
                );
            }
            eprintln!("wrote {} (its sha256 line is the file hash (PDF))", signed.path.display());
            Ok(ExitCode::SUCCESS)
        }
        Cmd::Diff { old, new, json } => {
            let a = diff::load(&old)?;
            let b = diff::load(&new)?;
            let d = diff::compare(&a, &b);
            let text = if json {
                format!("{}\n", serde_json::to_string_pretty(&d).map_err(|e| Error::Usage(e.to_string()))?)
            } else {
                diff::table(&d)
            };
            write_stdout(|w| w.write_all(text.as_bytes()))?;
            Ok(ExitCode::SUCCESS)
        }
        Cmd::Curve { file, member, location, format } => curve_cmd(file, member, location, format),
        Cmd::Trace { file, member, format } => trace_cmd(file, member, format),
    }
}

/// `report`: analyse, typeset and write the package and its sidecar.
fn report_cmd(
    file: PathBuf,
    output: Option<PathBuf>,
    overwrite: bool,
    templates: Option<PathBuf>,
    bounds: Bounds,
) -> Result<ExitCode, Error> {
    no_huge_pages();
    let out = output.unwrap_or_else(|| file.with_extension("pdf"));
    let mut side_path = out.clone().into_os_string();
    side_path.push(".sha256");
    let side_path = PathBuf::from(side_path);
    // refuse what could not be written before the work of making it
    output::preflight(&[&out, &side_path], overwrite)?;
    let templates_dir = templates.clone();
    let templates = match templates {
        Some(dir) => report::Templates::from_dir(&dir)?,
        None => report::Templates::builtin(),
    };
    let progress = Progress::new();
    progress.phase("reading and checking the input");
    let (src, pkg) = input::load(&file)?;
    if pkg.members.len() > REPORT_MEMBERS {
        return Err(Error::Usage(format!(
            "{} has {} members; a package typesets at most {REPORT_MEMBERS} (about {} sheets). Split the members into several input files, one package each; `check` takes them all at once.",
            file.display(),
            pkg.members.len(),
            REPORT_MEMBERS * 8
        )));
    }
    watchdog(bounds, templates_dir.as_deref());
    progress.phase(format!("analysing {} members", pkg.members.len()));
    let a = analysis::analyze_full(&pkg)?;
    let status = a.status();
    let prepared = report::prepare(&pkg, &src, &a, &templates)?;
    // the payload holds all of it now; the sheets are typeset from the views
    drop(a);
    let hooks = report::Hooks { progress: &|m| progress.phase(m), pause: &between_runs };
    let r = report::typeset(&pkg, &src, prepared, &templates, &hooks)?;
    progress.phase("writing");
    let name = out.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
    let side = sidecar::line(&r.pdf, &name);
    let file_hash = integrity::sha256_hex(&r.pdf);
    output::write_all(&[(out.clone(), r.pdf), (side_path.clone(), side.into_bytes())], overwrite)?;
    progress.done();
    print_warnings(&pkg);
    eprintln!(
        "wrote {} ({} sheets)\n  content hash (payload, on the cover): {}\n  file hash (PDF, in {}): {}",
        out.display(),
        r.pages,
        r.hash,
        side_path.display(),
        file_hash
    );
    Ok(result_code(status))
}

/// `verify`: the checks of a package file, one line each, and the verdict.
fn verify_cmd(
    file: PathBuf,
    templates: Option<PathBuf>,
    pubkey: Option<PathBuf>,
    expect: Option<String>,
    bounds: Bounds,
) -> Result<ExitCode, Error> {
    no_huge_pages();
    watchdog(bounds, templates.as_deref());
    let r = verify::verify(
        &file,
        &verify::Options {
            templates: templates.as_deref(),
            pubkey: pubkey.as_deref(),
            expect: expect.as_deref(),
            hooks: report::Hooks { pause: &between_runs, ..report::Hooks::default() },
        },
    )?;
    write_stdout(|w| {
        writeln!(w, "verify {}", file.display())?;
        for c in &r.checks {
            let tag = match c.ok {
                Some(true) => "ok  ",
                Some(false) => "FAIL",
                None => "--  ",
            };
            writeln!(w, "  [{tag}] {}: {}", c.name, c.detail)?;
        }
        writeln!(w, "{}", r.verdict())
    })?;
    Ok(ExitCode::from(r.exit_code()))
}

/// `curve`: the moment-curvature response of one member at one of its locations.
fn curve_cmd(
    file: PathBuf,
    member: Option<String>,
    location: Option<String>,
    format: CurveFormat,
) -> Result<ExitCode, Error> {
    let (_, pkg) = input::load(&file)?;
    print_warnings(&pkg);
    let ids: Vec<&str> = pkg.members.iter().map(|m| m.id.as_str()).collect();
    let found = match &member {
        Some(id) => pkg.members.iter().position(|m| &m.id == id),
        None if pkg.members.len() == 1 => Some(0),
        None => {
            return Err(Error::Usage(format!(
                "{} has {} members: choose one with --member ({})",
                file.display(),
                ids.len(),
                ids.join(", ")
            )));
        }
    };
    let Some(mi) = found else {
        return Err(Error::Usage(format!(
            "no member {:?} in {}; its members are {}",
            member.unwrap_or_default(),
            file.display(),
            ids.join(", ")
        )));
    };
    let member = pkg.members[mi].id.clone();
    let m = &pkg.members[mi];
    let r = analysis::analyze_member(m, pkg.basis(), false)?;
    let li = match &location {
        Some(name) => r.locations.iter().position(|l| &l.name == name).ok_or_else(|| {
            let names: Vec<&str> = r.locations.iter().map(|l| l.name.as_str()).collect();
            Error::Usage(format!("member {member} has no location {name:?}; its locations are {}", names.join(", ")))
        })?,
        None => r.governing,
    };
    let c = analysis::curve::moment_curvature(r.member(m), pkg.basis(), &r.sites[li], li)?;
    let text = match format {
        CurveFormat::Json => {
            let v = present::curve_json(&pkg, &c, &r.locations[li]);
            format!("{}\n", serde_json::to_string_pretty(&v).map_err(|e| Error::Usage(e.to_string()))?)
        }
        CurveFormat::Csv => present::curve_csv(&pkg, &c),
    };
    write_stdout(|w| w.write_all(text.as_bytes()))?;
    Ok(ExitCode::SUCCESS)
}

/// `trace`: every recorded step, of all members or of one.
fn trace_cmd(file: PathBuf, member: Option<String>, format: TraceFormat) -> Result<ExitCode, Error> {
    let (_, pkg) = input::load(&file)?;
    print_warnings(&pkg);
    if let Some(id) = &member
        && !pkg.members.iter().any(|m| &m.id == id)
    {
        let ids: Vec<&str> = pkg.members.iter().map(|m| m.id.as_str()).collect();
        return Err(Error::Usage(format!(
            "no member {id:?} in {}; its members are {}",
            file.display(),
            ids.join(", ")
        )));
    }
    let form = match format {
        TraceFormat::Text => strainsheet::TraceForm::Text,
        TraceFormat::Json => strainsheet::TraceForm::Json,
        TraceFormat::Csv => strainsheet::TraceForm::Csv,
    };
    // an analysis error stops the writing and is reported
    let mut outcome = Ok(());
    write_stdout(|w| {
        outcome = strainsheet::write_trace(&pkg, member.as_deref(), form, w)?;
        Ok(())
    })?;
    outcome?;
    Ok(ExitCode::SUCCESS)
}

/// `check`: the table of results, or their JSON.
fn check_cmd(file: PathBuf, json: bool) -> Result<ExitCode, Error> {
    let (_, pkg) = input::load(&file)?;
    let status = if json {
        let out = strainsheet::check_members(&pkg)?;
        write_stdout(|w| {
            out.write_json(&pkg, w)?;
            w.write_all(b"\n")
        })?;
        out.status
    } else {
        let a = analysis::analyze(&pkg, false)?;
        write_stdout(|w| w.write_all(present::check_table(&pkg, &a).as_bytes()))?;
        a.status()
    };
    Ok(result_code(status))
}

/// The exit status of a result: 0 every check met, 1 a check not met, 3 every check
/// met but only on open conditions (things this program does not check).
fn result_code(status: strainsheet::Status) -> ExitCode {
    match status {
        strainsheet::Status::Pass => ExitCode::SUCCESS,
        strainsheet::Status::Fail => ExitCode::from(1),
        strainsheet::Status::Conditional => ExitCode::from(3),
    }
}

/// The input's warnings (allowed but unusual input), on stderr.
fn print_warnings(pkg: &input::Package) {
    for w in &pkg.warnings {
        eprintln!("warning: {}: {}: {}", w.at, w.key, w.message);
    }
}

/// What the program does at each pause of the typesetting, when no Typst run is going
/// on. Typst keeps every layout of every run in its caches (comemo's statics) for the
/// life of the process, and the next runs need none of them: they are emptied. At the
/// end of a phase mimalloc also hands the memory freed back to the system, on every
/// thread, rather than when it next gets round to it; between batches of member runs
/// the next batch would only fault the same memory in again.
fn between_runs(pause: report::Pause) {
    typst::comemo::evict(0);
    if pause == report::Pause::Phase {
        // SAFETY: mi_collect takes a flag, touches only the allocator's own free lists
        // and is safe to call on any thread at any time.
        rayon::broadcast(|_| unsafe { libmimalloc_sys::mi_collect(true) });
        // SAFETY: as above, for the calling thread.
        unsafe { libmimalloc_sys::mi_collect(true) };
    }
}

/// Typesetting holds many small allocations for seconds. With transparent huge pages the
/// allocator's partly used 2 MiB pages count in full: the 60-member package peaked about
/// 45 MB higher with them. `check` keeps them: it took 38 ms with them, 48 ms without.
fn no_huge_pages() {
    #[cfg(target_os = "linux")]
    // SAFETY: PR_SET_THP_DISABLE takes plain integers and reads or writes no memory of
    // ours; if the kernel refuses, the pages stay as they were (nothing else changes).
    unsafe {
        libc::prctl(libc::PR_SET_THP_DISABLE, 1, 0, 0, 0);
    }
}

fn main() -> ExitCode {
    output::on_interrupt_clean_up();
    let cli = Cli::parse();
    match run(cli) {
        Ok(code) => code,
        Err(e) => {
            eprintln!("{e}");
            ExitCode::from(2)
        }
    }
}
