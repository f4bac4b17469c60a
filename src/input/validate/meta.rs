//! The package's own table: title, project, dates, units, the design basis, paper,
//! revisions and sign-offs.

use super::*;

pub(super) fn meta(cx: &mut Ctx, p: &raw::Package) -> Option<Meta> {
    let title = cx.text("title", &p.title, 80);
    let title = cx.required("title", title, "the package title, e.g. \"Flexural strength of pretensioned members\"");
    let project = cx.text("project", &p.project, 60);
    let project = cx.required("project", project, "the project name");
    let project_number = cx.text("project_number", &p.project_number, 30).unwrap_or_default();
    let client = cx.text("client", &p.client, 60).unwrap_or_default();
    let subject = cx.text("subject", &p.subject, 100).unwrap_or_default();
    let revision = cx.text("revision", &p.revision, 20);
    let revision = cx.required("revision", revision, "the revision of this issue, e.g. \"0\" or \"A\"");
    let date = cx.date("date", &p.date);
    let date = cx.required("date", date, "the report date, e.g. 2026-11-30");
    let notes = cx.text("notes", &p.notes, limits::TEXT);
    let basis_id = basis_id(cx, p);
    let basis = cx.basis.name().to_string();
    let paper = paper(cx, p);
    let revisions = revisions(cx, p, revision.as_ref());
    let signoffs = signoffs(cx, p);
    check_signoffs(cx, &signoffs);

    Some(Meta {
        title: title?,
        project: project?,
        project_number,
        client,
        subject,
        revision: revision?,
        date: date?,
        basis,
        basis_id,
        paper,
        notes,
        revisions,
        signoffs,
    })
}

/// The design basis named (ACI 318-19 by default), which the rest of the input then
/// follows (`cx.basis`).
fn basis_id(cx: &mut Ctx, p: &raw::Package) -> BasisId {
    let named = p.basis.clone().unwrap_or_else(|| "ACI 318-19".to_string());
    match BasisId::select(&named, cx.sys) {
        Ok(id) => {
            cx.basis = id.get(cx.sys);
            id
        }
        Err(known) => {
            cx.problem(
                "basis",
                format!("basis = {named:?} is not a design basis this version checks"),
                Some(known.to_string()),
            );
            BasisId::Aci318
        }
    }
}

/// The paper size: letter for US units, A4 for SI, unless named.
fn paper(cx: &mut Ctx, p: &raw::Package) -> Paper {
    match p.paper.as_deref() {
        None => match cx.sys {
            System::Us => Paper::Letter,
            System::Si => Paper::A4,
        },
        Some("letter") => Paper::Letter,
        Some("a4") => Paper::A4,
        Some(other) => {
            cx.problem(
                "paper",
                format!("paper = {other:?} is not a paper size this version prints"),
                Some("\"letter\" or \"a4\"".to_string()),
            );
            Paper::Letter
        }
    }
}

/// The revision history, oldest first, ending with the current revision.
fn revisions(cx: &mut Ctx, p: &raw::Package, revision: Option<&String>) -> Vec<Revision> {
    let mut revisions = Vec::new();
    for (i, r) in p.revisions.iter().enumerate() {
        cx.enter(Seg::Key("revisions"));
        cx.enter(Seg::Idx(i));
        let rev = cx.text("rev", &r.rev, 20);
        let rev = cx.required("rev", rev, "the revision mark");
        let d = cx.date("date", &r.date);
        let d = cx.required("date", d, "the date of the revision");
        let description = cx.text("description", &r.description, limits::SHORT_TEXT).unwrap_or_default();
        if let (Some(rev), Some(d)) = (rev, d) {
            if let Some(prev) = revisions.last().map(|x: &Revision| x.date)
                && d < prev
            {
                cx.problem(
                    "date",
                    format!("date = {d} is earlier than the revision before it ({prev})"),
                    Some("revisions listed oldest first".to_string()),
                );
            }
            revisions.push(Revision { rev, date: d, description });
        }
        cx.leave();
        cx.leave();
    }
    if let (Some(last), Some(revision)) = (revisions.last(), revision)
        && &last.rev != revision
    {
        cx.problem(
            "revision",
            format!("revision = {revision:?}, but the revision history ends with {:?}", last.rev),
            Some("the current revision as the last entry of [[package.revisions]]".to_string()),
        );
    }
    revisions
}

/// The sign-offs, one per role.
fn signoffs(cx: &mut Ctx, p: &raw::Package) -> Vec<Signoff> {
    let mut signoffs: Vec<Signoff> = Vec::new();
    for (i, s) in p.signoff.iter().enumerate() {
        cx.enter(Seg::Key("signoff"));
        cx.enter(Seg::Idx(i));
        let role = role(cx, s);
        let name = cx.text("name", &s.name, 60);
        let name = cx.required("name", name, "the name of the person signing");
        let license = cx.text("license", &s.license, 40);
        let firm = cx.text("firm", &s.firm, 80);
        let date = cx.date("date", &s.date);
        if let (Some(role), Some(name)) = (role, name) {
            if signoffs.iter().any(|x| x.role == role) {
                cx.problem(
                    "role",
                    format!("role = {:?} is listed twice", role.name()),
                    Some("one sign-off per role".to_string()),
                );
            }
            signoffs.push(Signoff { role, name, license, firm, date });
        }
        cx.leave();
        cx.leave();
    }
    signoffs
}

fn role(cx: &mut Ctx, s: &raw::Signoff) -> Option<Role> {
    match s.role.as_deref() {
        Some("prepared") => Some(Role::Prepared),
        Some("checked") => Some(Role::Checked),
        Some("approved") => Some(Role::Approved),
        Some(other) => {
            cx.problem(
                "role",
                format!("role = {other:?} is not a sign-off role"),
                Some("\"prepared\", \"checked\" or \"approved\"".to_string()),
            );
            None
        }
        None => {
            cx.problem("role", "role is missing", Some("\"prepared\", \"checked\" or \"approved\"".to_string()));
            None
        }
    }
}

/// The sign-offs together: a draft without a preparer and a checker, a checker who is
/// not the preparer, and the dates in order (prepared <= checked <= approved, and no
/// later role dated before an earlier one is).
fn check_signoffs(cx: &mut Ctx, signoffs: &[Signoff]) {
    let find = |r: Role| signoffs.iter().position(|s| s.role == r);
    let at_signoff = |i: usize| vec![Seg::Key("package"), Seg::Key("signoff"), Seg::Idx(i)];
    // a quick check needs no sign-offs; the package is then a draft (Meta::is_draft)
    for r in [Role::Prepared, Role::Checked] {
        if find(r).is_none() {
            cx.warn(
                "signoff",
                format!(
                    "no sign-off has role = {:?}: the package is a DRAFT until [[package.signoff]] tables for \"prepared\" and \"checked\" are given and dated",
                    r.name()
                ),
            );
        }
    }
    if let (Some(pi), Some(ci)) = (find(Role::Prepared), find(Role::Checked))
        && signoffs[pi].name.trim().eq_ignore_ascii_case(signoffs[ci].name.trim())
    {
        let mut path = at_signoff(ci);
        path.push(Seg::Key("name"));
        cx.problems.push(Problem {
            path,
            message: format!("the checker ({:?}) is the preparer", signoffs[ci].name),
            allowed: Some("a checker who is not the person who prepared the package".to_string()),
        });
    }
    let order: Vec<(usize, &Signoff)> = [Role::Prepared, Role::Checked, Role::Approved]
        .iter()
        .filter_map(|r| find(*r).map(|i| (i, &signoffs[i])))
        .collect();
    let mut issues = Vec::new();
    for w in order.windows(2) {
        let ((_, a), (bi, b)) = (w[0], w[1]);
        match (a.date, b.date) {
            (Some(da), Some(db)) if db < da => issues
                .push((bi, format!("the {} date {db} is earlier than the {} date {da}", b.role.name(), a.role.name()))),
            (None, Some(_)) => issues.push((bi, format!("{} is dated but {} is not", b.role.name(), a.role.name()))),
            _ => {}
        }
    }
    for (i, message) in issues {
        let mut path = at_signoff(i);
        path.push(Seg::Key("date"));
        cx.problems.push(Problem {
            path,
            message,
            allowed: Some("sign-off dates in order: prepared, then checked, then approved".to_string()),
        });
    }
}
