"""The ``scheduler`` command: a thin layer over the library.

Commands: ``new`` (starter config), ``factor`` (one-factorization of K_n with its certificate),
``plan`` (league config -> season folder), ``audit`` (fairness figures of any schedule file).
Exit codes: 0 ok, 1 the audited schedule is invalid, 2 unusable input or rules that cannot hold,
3 an internal error (a bug: please report it with the input).
"""

from __future__ import annotations

import json
import sys
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from functools import wraps
from pathlib import Path
from typing import Annotated, Any

import typer
from rich.console import Console
from rich.table import Table

from scheduler.errors import InputError, SchedulerError

app = typer.Typer(
    add_completion=False,
    no_args_is_help=True,
    help="Plan fair round-robin seasons and audit any schedule.",
    pretty_exceptions_enable=False,
)
out = Console(highlight=False, soft_wrap=True)
err = Console(stderr=True, highlight=False, soft_wrap=True)

EXIT_OK, EXIT_INVALID, EXIT_INPUT, EXIT_INTERNAL = 0, 1, 2, 3


def _version(value: bool) -> None:
    if value:
        from scheduler import __version__

        out.print(f"scheduler {__version__}")
        raise typer.Exit(EXIT_OK)


@app.callback()
def _main(
    version: Annotated[
        bool,
        typer.Option("--version", callback=_version, is_eager=True, help="Print the version."),
    ] = False,
) -> None:
    """Plan fair round-robin seasons and audit any schedule."""


def _guarded(command: Callable[..., Any]) -> Callable[..., Any]:
    """Turn library errors into one clear message and an exit code, never a traceback."""

    @wraps(command)
    def run(*args: Any, **kwargs: Any) -> Any:
        try:
            return command(*args, **kwargs)
        except typer.Exit:
            raise
        except SchedulerError as exc:
            err.print(f"[bold]error:[/bold] {_plain(str(exc))}")
            raise typer.Exit(EXIT_INPUT) from None
        except KeyboardInterrupt:
            err.print("interrupted")
            raise typer.Exit(130) from None
        except MemoryError:
            err.print("error: not enough memory for this input")
            raise typer.Exit(EXIT_INPUT) from None
        except Exception as exc:  # a bug: say so plainly instead of a traceback
            err.print(
                f"internal error ({type(exc).__name__}): {_plain(str(exc))}\n"
                "This is a bug in the scheduler; please report it together with the input."
            )
            raise typer.Exit(EXIT_INTERNAL) from None

    return run


def _plain(text: str) -> str:
    """Escape rich markup in messages that quote user text."""
    return text.replace("[", "\\[")


@contextmanager
def _progress(enabled: bool) -> Iterator[Callable[[str, float], None] | None]:
    """A progress display on stderr; yields a ``(message, fraction)`` callback."""
    if not enabled or not err.is_terminal:
        yield None
        return
    from rich.progress import BarColumn, Progress, TextColumn, TimeElapsedColumn

    with Progress(
        TextColumn("{task.description}"),
        BarColumn(),
        TimeElapsedColumn(),
        console=err,
        transient=True,
    ) as bar:
        task = bar.add_task("starting", total=1.0)

        def update(message: str, fraction: float) -> None:
            bar.update(task, description=message, completed=max(0.0, min(1.0, fraction)))

        yield update


def _parse_teams(text: str) -> int:
    try:
        value = int(text.strip(), 10)
    except ValueError:
        raise InputError(f"the number of teams must be a whole number, got {text!r}") from None
    return value


@app.command()
@_guarded
def new(
    path: Annotated[Path, typer.Argument(help="Where to write the starter league file (.toml).")],
    teams: Annotated[
        Path | None,
        typer.Option(help="Build the file from a team list (.xlsx or .csv): team, code, "
                     "division, home ground, unavailable dates."),
    ] = None,
) -> None:
    """Write a commented starter league config to PATH (never overwrites a file)."""
    from scheduler.config import write_starter_config

    if teams is not None:
        from scheduler.config.teamlist import build_from_team_list, write_new_file

        written = write_new_file(path, build_from_team_list(teams))
        command = "plan-divisions" if "[federation]" in written.read_text("utf-8") else "plan"
        out.print(f"wrote {written}")
        out.print(f"next: edit its calendar, then run  scheduler {command} {written} --out season")
        return
    written = write_starter_config(path)
    out.print(f"wrote {written}")
    out.print(f"next: edit it, then run  scheduler plan {written} --out season")


@app.command(context_settings={"ignore_unknown_options": True})
@_guarded
def factor(
    teams: Annotated[str, typer.Argument(help="Number of teams (2 or more).", metavar="N")],
    seed: Annotated[int, typer.Option(help="Seed of the randomised searches.")] = 0,
    budget: Annotated[
        float, typer.Option(help="Seconds the search may use when no formula covers N.")
    ] = 10.0,
    as_json: Annotated[bool, typer.Option("--json", help="Print one JSON object.")] = False,
    summary: Annotated[bool, typer.Option(help="Leave the rounds out of the text output.")] = False,
) -> None:
    """Print a one-factorization for N teams: method, source, mixing certificate and rounds."""
    from scheduler.factorization import factorize

    n_teams = _parse_teams(teams)
    if budget <= 0:
        raise InputError(f"--budget must be a positive number of seconds, got {budget}")
    with _progress(not as_json) as progress:
        fac = factorize(n_teams, seed=seed, budget=budget, progress=progress)
    cert = fac.certificate()
    bye = fac.bye_vertex if n_teams % 2 else None
    rounds = [
        [[a, b] for a, b in games if bye is None or bye not in (a, b)] for games in fac.rounds
    ]
    if as_json:
        payload = {
            "teams": n_teams,
            "order": fac.n,
            "perfect": cert.perfect,
            "perfect_pairs": cert.perfect_pairs,
            "pairs": cert.pairs,
            "method": fac.method,
            "source": fac.source,
            "valid": cert.valid,
            "imperfect_examples": [
                {"rounds": [p.first + 1, p.second + 1], "cycles": p.label}
                for p in cert.imperfect[:10]
            ],
            "rounds": rounds,
        }
        sys.stdout.write(json.dumps(payload, separators=(",", ":")) + "\n")
        return
    with_bye = ", with a bye" if bye is not None else ""
    out.print(f"[bold]{n_teams} teams[/bold] (K_{fac.n}{with_bye})")
    out.print(f"method:  {_plain(fac.method)}")
    out.print(f"source:  {_plain(fac.source)}")
    if cert.perfect:
        out.print(
            f"perfect: yes: any two rounds link all teams into one cycle "
            f"({cert.perfect_pairs} of {cert.pairs} pairs of rounds)"
        )
    else:
        out.print(f"perfect: no: {cert.perfect_pairs} of {cert.pairs} pairs of rounds are perfect")
        for pair in cert.imperfect[:5]:
            first, second = pair.first + 1, pair.second + 1
            out.print(f"         rounds {first} and {second} split into cycles {pair.label}")
    if not cert.valid:
        for problem in cert.problems:
            out.print(f"problem: {_plain(problem)}")
    if summary:
        return
    for number, games in enumerate(rounds, start=1):
        text = "  ".join(f"{a}-{b}" for a, b in games)
        byes = ""
        if bye is not None:
            sitting = set(range(n_teams)) - {v for g in games for v in g}
            byes = f"  (bye: {', '.join(str(v) for v in sorted(sitting))})"
        out.print(f"round {number:>3}: {text}{byes}")


@app.command()
@_guarded
def plan(
    config: Annotated[Path, typer.Argument(help="League config (.toml or .yaml).")],
    out_dir: Annotated[Path, typer.Option("--out", "-o", help="Output folder.")] = Path("season"),
    seed: Annotated[int | None, typer.Option(help="Override the config's seed.")] = None,
    time_limit: Annotated[
        float | None, typer.Option(help="Solver time limit in seconds (overrides the config).")
    ] = None,
    force: Annotated[
        bool, typer.Option(help="Replace an output folder that holds another league's season.")
    ] = False,
    quiet: Annotated[bool, typer.Option(help="Print only the output folder.")] = False,
) -> None:
    """Plan a season from a league config and write it to the output folder."""
    from scheduler.balance import plan_season
    from scheduler.config import load_league
    from scheduler.export import write_season_outputs
    from scheduler.fairness import compute_fairness

    if time_limit is not None and time_limit <= 0:
        raise InputError(f"--time-limit must be a positive number of seconds, got {time_limit}")
    league = load_league(config)
    with _progress(not quiet) as progress:
        result = plan_season(league, seed=seed, time_limit=time_limit, progress=progress)
    season = result.season
    fairness = compute_fairness(season)
    written = write_season_outputs(
        season,
        fairness,
        out_dir,
        force=force,
        config_path=config,
        game_minutes=league.calendar.game_minutes,
        side_labels=league.format.grid_labels,
    )
    if quiet:
        out.print(str(out_dir))
        return
    _print_fairness(fairness, title=f"{season.league} {season.season_id}")
    for option in result.options:
        mark = "chosen" if option.chosen else "considered"
        out.print(
            f"{mark}: {_plain(option.label)}: perfect pairs {option.perfect_pairs}/{option.pairs}, "
            f"breaks {option.breaks}"
        )
    for note in result.notes:
        out.print(f"note: {_plain(note)}")
    out.print(f"wrote {len(written)} files to {out_dir}")


@app.command("plan-divisions")
@_guarded
def plan_divisions(
    config: Annotated[Path, typer.Argument(help="Federation file of several divisions.")],
    out_dir: Annotated[Path, typer.Option("--out", "-o", help="Output folder.")] = Path("season"),
    workers: Annotated[
        int, typer.Option(help="Worker processes on this machine (without --cluster).")
    ] = 2,
    cluster: Annotated[
        str | None, typer.Option(help="Address of a running Dask scheduler (tcp://host:8786).")
    ] = None,
    time_limit: Annotated[
        float | None, typer.Option(help="Solver seconds per division (overrides the file).")
    ] = None,
    force: Annotated[
        bool, typer.Option(help="Replace an output folder that holds something else.")
    ] = False,
    quiet: Annotated[bool, typer.Option(help="Print only the output folder.")] = False,
) -> None:
    """Plan every division of a federation file (units of divisions in parallel, on Dask)."""
    from scheduler.config.federation import load_federation
    from scheduler.divisions.execute import plan_federation
    from scheduler.divisions.outputs import write_federation_outputs

    if time_limit is not None and time_limit <= 0:
        raise InputError(f"--time-limit must be a positive number of seconds, got {time_limit}")
    federation = load_federation(config)
    with _progress(not quiet) as progress:
        result = plan_federation(federation, workers=workers, cluster=cluster,
                                 time_limit=time_limit, progress=progress)
    if not result.check.valid:
        raise RuntimeError("the plan breaks rules across divisions: "
                           + "; ".join(result.check.problems[:5]))
    write_federation_outputs(result, out_dir, force=force, config_path=config)
    if quiet:
        out.print(str(out_dir))
        return
    out.print(f"{len(result.plans)} divisions in {len(result.units)} units: "
              f"{result.wall_seconds:.1f} s (units' own time {result.solve_seconds:.1f} s)")
    for figure in result.check.complement:
        out.print(f"complementary {_plain(figure.ground)}: {figure.complementary_days} of "
                  f"{figure.common_days} common match days")
    out.print(f"wrote {out_dir}/index.html and a folder per division")


@app.command()
@_guarded
def audit(
    file: Annotated[Path, typer.Argument(help="A schedule: .csv, .xlsx or season.json.")],
    as_json: Annotated[bool, typer.Option("--json", help="Print one JSON object.")] = False,
    report: Annotated[
        Path | None, typer.Option(help="Also write the HTML fairness report here.")
    ] = None,
    timezone: Annotated[
        str | None,
        typer.Option(help="IANA time zone of kick-off times written without an offset."),
    ] = None,
) -> None:
    """Check any schedule and print its fairness figures (exit 1 when it is invalid)."""
    from scheduler.audit import audit_file

    result = audit_file(file, timezone=timezone)
    if report is not None and result.fairness is not None:
        from scheduler.export.report import render_report
        from scheduler.export.safety import atomic_write_text

        if report.resolve() == file.resolve():
            raise InputError("--report would overwrite the audited file", location=str(report))
        atomic_write_text(report, render_report(result.season, result.fairness))
    if as_json:
        sys.stdout.write(json.dumps(result.to_dict(), ensure_ascii=False, indent=2) + "\n")
    else:
        if result.valid:
            out.print(f"[bold]valid[/bold]: {file}")
        else:
            out.print(f"[bold]invalid[/bold]: {file}")
            for problem in result.problems:
                out.print(f"  - {_plain(str(problem))}")
        if result.fairness is not None:
            _print_fairness(result.fairness, title=str(file.name))
        if report is not None and result.fairness is not None:
            out.print(f"wrote {report}")
    raise typer.Exit(EXIT_OK if result.valid else EXIT_INVALID)


def _print_fairness(fairness: Any, *, title: str) -> None:
    """The headline figures as a table (the full set is in season.json and the report)."""
    table = Table(title=f"Fairness: {_plain(title)}", show_header=True, header_style="bold")
    table.add_column("figure")
    table.add_column("value", justify="right")
    table.add_column("reference")
    for label, value, reference in _headline_rows(fairness.summary()):
        table.add_row(label, value, reference)
    out.print(table)


def _headline_rows(f: dict) -> list[tuple[str, str, str]]:
    """Rows of the headline table from ``FairnessReport.summary()``."""
    rows = [
        ("teams", str(f["teams"]), ""),
        ("rounds", str(f["rounds"]), ""),
        (
            "perfect pairs of rounds",
            f"{f['perfect_pairs']}/{f['pairs']}",
            "perfect mixing" if f["perfect"] else "not perfect",
        ),
        ("breaks", str(f["breaks_total"]), f"lower bound {f['breaks_lower_bound']}"),
        ("largest home-count gap", str(f["home_gap_max"]), "after any round"),
    ]
    if f["carry_over_value"] is not None:
        low, high = f["carry_over_lower_bound"], f["carry_over_upper_bound"]
        bounds = f"bounds {low}..{high}" if low is not None and high is not None else ""
        rows.append(("carry-over value", str(f["carry_over_value"]), bounds))
    if f["rest_days_min"] is not None:
        rows.append(("fewest rest days", str(f["rest_days_min"]), "league rules come first"))
    if f["separation_min"] is not None:
        rows.append(("fewest rounds between meetings", str(f["separation_min"]), ""))
    return rows


def main() -> None:
    """Console entry point."""
    app()


if __name__ == "__main__":
    main()
