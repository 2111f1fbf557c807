//! `ampreport netlist JOB --mod N [--after] [--setting S] [-o FILE]`: a
//! mod's network as a plain SPICE netlist, on standard output (also `-o -`)
//! or written atomically to a file that passes `typeset::check_output`.

use std::io::Write;

use super::args::NetlistArgs;
use super::exit::Exit;
use super::load;
use crate::calc::network::{State, resolve_state, state};
use crate::report::netlist::{NetlistHeading, spice};
use crate::typeset::Input;

pub fn run(args: &NetlistArgs) -> Exit {
    let ratings = match load::ratings(&args.job.ratings) {
        Ok(r) => r,
        Err(e) => return e,
    };
    let mut said = super::said::Said::default();
    let loaded = load::job(&args.job.job, args.job.shop_choice(), &ratings, &mut said);
    said.print();
    let loaded = match loaded {
        Ok(l) => l,
        Err(e) => return e,
    };
    let job = &loaded.decoded.job;
    let with_network: Vec<String> = job
        .mods
        .iter()
        .enumerate()
        .filter(|(_, m)| m.network.is_some())
        .map(|(i, _)| (i + 1).to_string())
        .collect();
    let usage = |msg: String| {
        eprintln!("error: {msg}");
        Exit::Usage
    };
    let networks_words = if with_network.is_empty() {
        "no mod of this job has a network".to_string()
    } else {
        format!("mods with a network: {}", with_network.join(", "))
    };
    let Some(m) = args.mod_number.checked_sub(1).and_then(|i| job.mods.get(i)) else {
        return usage(format!(
            "the job has {} mod{}, so there is no mod {} ({networks_words})",
            job.mods.len(),
            if job.mods.len() == 1 { "" } else { "s" },
            args.mod_number
        ));
    };
    let Some(net) = &m.network else {
        return usage(format!(
            "mod {} (“{}”) has no network ({networks_words})",
            args.mod_number, m.what
        ));
    };
    let which = if args.after {
        if !net.has_after() {
            return usage(format!(
                "mod {} does not change its network (it has no `after` edits), so there is no --after",
                args.mod_number
            ));
        }
        State::After
    } else {
        State::Before
    };
    let count = state(net, which).setting_count();
    if args.setting == 0 || args.setting > count {
        return usage(format!(
            "the network {} mod {} has {count} setting{}; --setting takes 1{}",
            which.word(),
            args.mod_number,
            if count == 1 { "" } else { "s" },
            if count == 1 {
                String::new()
            } else {
                format!(" to {count}")
            }
        ));
    }
    let (resolved, source) = match resolve_state(net, which, args.setting - 1, job, &ratings) {
        Ok(r) => r,
        Err(problem) => {
            eprintln!(
                "error: the network of mod {} cannot be written: {problem}",
                args.mod_number
            );
            return Exit::InvalidInput;
        }
    };
    let heading = NetlistHeading {
        job_id: &job.info.id,
        mod_number: args.mod_number,
        mod_what: &m.what,
        label: net.label.as_deref(),
        state: which.word(),
        setting: args.setting,
    };
    let text = spice(&heading, &resolved, &source);
    match &args.output {
        None => {
            print!("{text}");
            Exit::Success
        }
        Some(path) if crate::input_file::is_dash(path) => {
            print!("{text}");
            Exit::Success
        }
        Some(path) => {
            // Never over the job, a ratings or shop file, a link or a device.
            let mut inputs = vec![Input::new(&args.job.job, "cli-input-job-file")];
            inputs.extend(
                args.job
                    .ratings
                    .iter()
                    .map(|r| Input::new(r, "cli-input-ratings-file")),
            );
            if let Some(shop) = &loaded.shop {
                inputs.push(Input::new(shop.path(), "cli-input-shop-profile"));
            }
            if let Err(e) = crate::typeset::check_output(path, &inputs) {
                eprintln!("{:?}", miette::Report::new(e));
                return Exit::Usage;
            }
            let dir = match path.parent() {
                Some(p) if !p.as_os_str().is_empty() => p.to_path_buf(),
                _ => std::path::PathBuf::from("."),
            };
            let result = tempfile::NamedTempFile::new_in(&dir).and_then(|mut tmp| {
                tmp.write_all(text.as_bytes())?;
                tmp.as_file().sync_all()?;
                tmp.persist(path).map_err(|e| e.error)?;
                Ok(())
            });
            match result {
                Ok(()) => Exit::Success,
                Err(e) => {
                    eprintln!("error: cannot write {}: {e}", path.display());
                    Exit::Environment
                }
            }
        }
    }
}
