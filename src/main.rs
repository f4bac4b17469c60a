//! The command line: parse arguments, call the library, map outcomes to exit statuses
//! (0 all checks pass / intact, 1 a check fails / changed, 2 bad input or error).

use clap::{Parser, Subcommand, ValueEnum};
use std::path::PathBuf;
use std::process::ExitCode;
use strainsheet::{Error, analysis, input, output, present, report, seal, starter};

#[derive(Parser)]
#[command(
    name = "strainsheet",
    version,
    about = "Flexural strength of pretensioned concrete members by strain compatibility, \
             written up as a paginated, signed-off PDF calculation package.",
    after_help = "Exit status: 0 every check passes, 1 a check fails, 2 bad input or error."
)]
struct Cli {
    #[command(subcommand)]
    cmd: Cmd,
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
    /// Analyse every member and print a summary (exit 1 if a check fails).
    Check {
        file: PathBuf,
        /// Print JSON on stdout instead of the table.
        #[arg(long)]
        json: bool,
    },
    /// Write the calculation package (PDF/A-3b) and its SHA-256 sidecar.
    Report {
        file: PathBuf,
        /// Output file (default: the input's name with .pdf).
        #[arg(short, long)]
        output: Option<PathBuf>,
        /// Replace existing output files.
        #[arg(long)]
        overwrite: bool,
        /// Use the templates in this folder instead of the built-in ones.
        #[arg(long, value_name = "DIR")]
        templates: Option<PathBuf>,
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
        Cmd::Check { file, json } => {
            let (_, pkg) = input::load(&file)?;
            let a = analysis::analyze(&pkg, false)?;
            if json {
                let v = present::check_json(&pkg, &a);
                println!("{}", serde_json::to_string_pretty(&v).map_err(|e| Error::Usage(e.to_string()))?);
            } else {
                print!("{}", present::check_table(&pkg, &a));
            }
            Ok(if a.pass() { ExitCode::SUCCESS } else { ExitCode::from(1) })
        }
        Cmd::Report { file, output, overwrite, templates } => {
            let out = output.unwrap_or_else(|| file.with_extension("pdf"));
            let templates = match templates {
                Some(dir) => report::Templates::from_dir(&dir)?,
                None => report::Templates::builtin(),
            };
            let (src, pkg) = input::load(&file)?;
            let a = analysis::analyze(&pkg, true)?;
            let r = report::render(&pkg, &src, &a, &templates)?;
            let name = out.file_name().map(|n| n.to_string_lossy().into_owned()).unwrap_or_default();
            let sidecar = seal::sidecar(&r.pdf, &name);
            let mut side_path = out.clone().into_os_string();
            side_path.push(".sha256");
            output::write_all(&[(out.clone(), r.pdf), (PathBuf::from(side_path), sidecar.into_bytes())], overwrite)?;
            for w in &pkg.warnings {
                eprintln!("warning: {}: {}: {}", w.at, w.key, w.message);
            }
            eprintln!("wrote {} ({} sheets, content SHA-256 {})", out.display(), r.pages, r.hash);
            Ok(if a.pass() { ExitCode::SUCCESS } else { ExitCode::from(1) })
        }
        Cmd::Trace { file, member, format } => {
            let (_, pkg) = input::load(&file)?;
            let a = analysis::analyze(&pkg, true)?;
            let chosen: Vec<_> = a.members.iter().filter(|m| member.as_ref().is_none_or(|id| &m.id == id)).collect();
            if chosen.is_empty() {
                let ids: Vec<&str> = a.members.iter().map(|m| m.id.as_str()).collect();
                return Err(Error::Usage(format!(
                    "no member {:?} in {}; its members are {}",
                    member.unwrap_or_default(),
                    file.display(),
                    ids.join(", ")
                )));
            }
            match format {
                TraceFormat::Text => print!("{}", present::trace_text(&pkg, &chosen)),
                TraceFormat::Json => println!(
                    "{}",
                    serde_json::to_string_pretty(&present::trace_json(&pkg, &chosen))
                        .map_err(|e| Error::Usage(e.to_string()))?
                ),
                TraceFormat::Csv => print!("{}", present::trace_csv(&pkg, &chosen)),
            }
            Ok(ExitCode::SUCCESS)
        }
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
