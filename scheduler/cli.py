"""The ``scheduler`` command: a thin layer over the library.

Commands: ``new`` (starter config), ``factor`` (one-factorization of K_n with its certificate),
``plan`` (league config -> season folder), ``choose`` (another option of a planned season,
without solving again), ``replan`` (re-plan a season folder after what
happened, with the fewest changes), ``audit`` (fairness figures of any schedule file).
Exit codes: 0 ok, 1 the audited schedule is invalid, 2 unusable input or rules that cannot hold,
3 an internal error (a bug: please report it with the input), 130 interrupted (Ctrl-C).

A closed standard output (``scheduler audit f.csv | head -1``) is not an error: the command
finishes its work silently and exits with the code it would have had.
"""

from __future__ import annotations

import inspect
import json
import os
import sys
from collections.abc import Callable, Iterator
from contextlib import contextmanager
from functools import wraps
from pathlib import Path
from typing import Annotated, Any

import typer
from rich.console import Console
from rich.table import Table

from scheduler.errors import InputError, OutputError, SchedulerError

app = typer.Typer(
    add_completion=False,
    no_args_is_help=True,
    help="Plan fair round-robin seasons and audit any schedule.",
    pretty_exceptions_enable=False,
)


class _Console(Console):
    """A rich console that reports a closed pipe as ``BrokenPipeError`` (rich itself exits 1,
    which would read as "invalid" after ``audit``)."""

    def on_broken_pipe(self) -> None:
        raise BrokenPipeError


out = _Console(highlight=False, soft_wrap=True)
err = _Console(stderr=True, highlight=False, soft_wrap=True)

EXIT_OK, EXIT_INVALID, EXIT_INPUT, EXIT_INTERNAL = 0, 1, 2, 3
EXIT_INTERRUPTED = 130


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


def _silence_stdout() -> None:
    """Point standard output at the null device after the reader closed the pipe, so that no
    later write or the final flush fails again."""
    try:
        null = os.open(os.devnull, os.O_WRONLY)
        os.dup2(null, sys.stdout.fileno())
        os.close(null)
    except (OSError, ValueError):
        pass


class _Verdict:
    """The exit code a command has settled on before it prints (used when the pipe closes)."""

    code = EXIT_OK


def _guarded(command: Callable[..., Any]) -> Callable[..., Any]:
    """Turn library errors into one clear message and an exit code, never a traceback."""

    @wraps(command)
    def run(*args: Any, **kwargs: Any) -> Any:
        _Verdict.code = EXIT_OK
        try:
            return command(*args, **kwargs)
        except typer.Exit:
            raise
        except BrokenPipeError:
            # The reader of our output went away (``| head -1``): not a failure of ours.
            _silence_stdout()
            raise typer.Exit(_Verdict.code) from None
        except SchedulerError as exc:
            err.print(f"[bold]error:[/bold] {_plain(str(exc))}")
            raise typer.Exit(EXIT_INPUT) from None
        except KeyboardInterrupt as exc:
            err.print(str(exc) if str(exc) else "interrupted; nothing was written")
            raise typer.Exit(EXIT_INTERRUPTED) from None
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


PROGRESS_MODES = ("auto", "bar", "plain", "json", "none")


@contextmanager
def _progress(
    enabled: bool, mode: str = "auto"
) -> Iterator[Callable[[str, float], None] | None]:
    """A progress display on stderr; yields a ``(message, fraction)`` callback.

    ``mode``: ``auto`` (a bar on a terminal, plain lines every few seconds otherwise, nothing
    when not ``enabled``), ``bar``, ``plain``, ``json`` (JSON Lines for tools, see
    :mod:`scheduler.progress`) or ``none``. An explicit mode wins over ``enabled``.
    """
    if mode not in PROGRESS_MODES:
        raise InputError(
            f"--progress must be one of {', '.join(PROGRESS_MODES)}, got {mode!r}",
            location="--progress",
        )
    if mode == "none" or (mode == "auto" and not enabled):
        yield None
        return
    if mode == "json" or mode == "plain" or (mode == "auto" and not err.is_terminal):
        from scheduler.progress import JsonProgress, PlainProgress

        display = JsonProgress if mode == "json" else PlainProgress
        with display(sys.stderr) as show:
            yield show
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
    path: Annotated[
        Path,
        typer.Argument(help="Where to write the starter league file (.toml, .yaml or .yml)."),
    ],
    teams: Annotated[
        Path | None,
        typer.Option(help="Build the file from a team list (.xlsx or .csv): team, code, "
                     "division, home ground, unavailable dates."),
    ] = None,
) -> None:
    """Write a commented starter league file to PATH (TOML or YAML by its ending; never
    overwrites a file).
    \f
    Parameters
    ----------
    path
        The league file to write; its ending (.toml, .yaml, .yml) chooses the format.
    teams
        A team list (.xlsx or .csv) to build the file from; it is then written as TOML.

    Raises
    ------
    InputError
        A team list with a file name not ending in .toml, or a file that already exists
        (exit code 2).
    """
    from scheduler.config import write_starter_config

    if teams is not None:
        from scheduler.config.teamlist import build_from_team_list, write_new_file

        if path.suffix.lower() != ".toml":
            raise InputError(
                "a league built from a team list is written as TOML; give a name ending in .toml",
                location=str(path),
            )

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
    time_limit: Annotated[
        float,
        typer.Option("--time-limit", help="Seconds the search may use when no formula covers N."),
    ] = 10.0,
    budget: Annotated[
        float | None, typer.Option("--budget", hidden=True, help="Old name of --time-limit.")
    ] = None,
    as_json: Annotated[bool, typer.Option("--json", help="Print one JSON object.")] = False,
    summary: Annotated[bool, typer.Option(help="Leave the rounds out of the text output.")] = False,
) -> None:
    """Print a one-factorization for N teams: method, source, mixing certificate and rounds.
    \f
    Parameters
    ----------
    teams
        The number of teams as typed (2 or more; an odd number adds a bye).
    seed
        Seed of the randomised searches.
    time_limit
        Seconds the search may use when no formula covers the number of teams (positive).
    budget
        Old name of ``time_limit``, still accepted with a note.
    as_json
        Print one JSON object instead of text.
    summary
        Leave the rounds out of the text output.

    Raises
    ------
    InputError
        A number of teams or a time limit that cannot be used (exit code 2).
    """
    from scheduler.factorization import factorize

    n_teams = _parse_teams(teams)
    option = "--time-limit"
    if budget is not None:
        err.print("note: --budget is the old name of --time-limit")
        time_limit, option = budget, "--budget"
    if not time_limit > 0:
        raise InputError(f"{option} must be a positive number of seconds, got {time_limit}")
    with _progress(not as_json) as progress:
        fac = factorize(n_teams, seed=seed, budget=time_limit, progress=progress)
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
        if "p1f_known" in fac.details:
            payload["perfect_known"] = fac.details["p1f_known"]
            payload["perfect_known_reason"] = fac.details["p1f_reason"]
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
        if fac.details.get("p1f_known") is True:
            out.print(f"         a perfect one is known ({_plain(fac.details['p1f_reason'])}), "
                      f"but this tool has none for K_{fac.n} yet: the best found is shown "
                      "(docs/factorization-search.md)")
        elif fac.details.get("p1f_known") is False:
            out.print(f"         {_plain(fac.details['p1f_reason'])}")
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
        float | None,
        typer.Option(
            "--time-limit",
            help="Seconds the planner may search (overrides time_limit_seconds of the league "
            "file).",
        ),
    ] = None,
    force: Annotated[
        bool,
        typer.Option(
            "--force",
            help="Plan into a folder that holds files this planner did not write (they are "
            "kept) or another league's season (replaced).",
        ),
    ] = False,
    quiet: Annotated[bool, typer.Option(help="Print only the output folder.")] = False,
    workers: Annotated[
        int,
        typer.Option(help="For a file of several divisions: worker processes on this machine."),
    ] = 2,
    cluster: Annotated[
        str | None,
        typer.Option(help="For a file of several divisions: address of a running Dask "
                     "scheduler (tcp://host:8786) instead of workers on this machine."),
    ] = None,
    progress_mode: Annotated[
        str,
        typer.Option(
            "--progress",
            help="Progress on stderr: auto (a bar on a terminal, plain lines every few seconds "
            "otherwise), bar, plain, json (JSON Lines for tools) or none.",
        ),
    ] = "auto",
) -> None:
    """Plan a season from a league config and write it to the output folder (a file of several
    divisions plans every division, see plan-divisions).
    \f
    Parameters
    ----------
    config
        The league file (.toml or .yaml), or a federation file of several divisions.
    out_dir
        The season folder to write (built beside and swapped in as a whole).
    seed
        Overrides the league file's seed.
    time_limit
        Seconds the planner may search, overriding ``time_limit_seconds`` of the file.
    force
        Plan into a folder holding files this planner did not write (kept) or another
        league's season (replaced).
    quiet
        Print only the output folder.
    workers
        For a federation file: worker processes on this machine.
    cluster
        For a federation file: address of a running Dask scheduler.
    progress_mode
        Progress on stderr: ``auto``, ``bar``, ``plain``, ``json`` or ``none``.

    Raises
    ------
    InputError
        Unusable input or options (exit code 2).
    InfeasibleError
        Rules that cannot hold together, explained (exit code 2).

    References
    ----------
    ``docs/season-folder.md``.
    """
    from scheduler.config import load_league
    from scheduler.config.federation import is_federation_file

    if is_federation_file(config):
        _plan_federation(config, out_dir, workers=workers, cluster=cluster,
                         time_limit=time_limit, force=force, quiet=quiet)
        return

    if time_limit is not None and not time_limit > 0:
        raise InputError(f"--time-limit must be a positive number of seconds, got {time_limit}")
    # The league file's limits are checked before the solver and exporters are even imported.
    league = load_league(config)
    from scheduler.export import write_season_outputs
    from scheduler.export.bundle import check_output_folder
    from scheduler.fairness import compute_fairness
    from scheduler.plan import plan_season

    # Refuse an unusable output folder before the long part, not after it.
    check_output_folder(
        out_dir, force=force, config_path=config, league=(league.name, league.season)
    )
    with _progress(not quiet, progress_mode) as progress:
        result = plan_season(league, seed=seed, time_limit=time_limit, progress=progress)
    season = result.season
    fairness = compute_fairness(season, league)
    written = write_season_outputs(
        season,
        fairness,
        out_dir,
        force=force,
        config_path=config,
        game_minutes=league.calendar.game_minutes,
        side_labels=league.format.grid_labels,
    )
    # From here on the new season is in place; an interrupt only cuts the printing short.
    try:
        _print_plan(result, fairness, season, written, out_dir, quiet=quiet, config=config)
    except KeyboardInterrupt:
        raise KeyboardInterrupt(
            f"interrupted; the new season had already been written to {out_dir}"
        ) from None


def _print_plan(
    result: Any, fairness: Any, season: Any, written: list[Path], out_dir: Path, *, quiet: bool,
    config: Path | None = None,
) -> None:
    if quiet:
        out.print(str(out_dir))
        return
    _print_fairness(fairness, title=f"{season.league} {season.season_id}")
    _print_rule_checks(fairness.rule_checks)
    from scheduler.fairness.names import plain_text

    _print_options(result.options, result.why, out_dir, config)
    for note in result.notes:
        out.print(f"note: {_plain(plain_text(note))}")
    out.print(f"wrote {len(written)} files to {out_dir}")


def _print_options(options: Any, why: str, out_dir: Path, league_file: Path | None = None) -> None:
    """The options of a plan, numbered as in the report, which one is chosen and why, how many
    are not dominated, and how to choose another without solving again."""
    from scheduler.fairness.frontier import frontier_summary
    from scheduler.fairness.names import plain_text

    if len(options) < 2:
        return
    summary = frontier_summary([(o.perfect_pairs, o.pairs, o.breaks, o.carry_over)
                                for o in options])
    out.print("options (not dominated: no other option is at least as good in every figure "
              "and better in one):")
    for number, option in enumerate(options, start=1):
        mark = "chosen" if option.chosen else "considered"
        if option.on_frontier:
            mark += ", not dominated"
        out.print(f"  {number}. {mark}: {_plain(plain_text(option.label))}: "
                  f"{_plain(option.figures())}")
    if "fewer than three" not in summary:  # otherwise the notes say it, with the reason
        out.print(_plain(summary))
    if why:
        out.print(f"chosen by the league's priorities: {_plain(why)}")
    league = str(league_file) if league_file is not None else "LEAGUE"
    out.print(f"to choose another without solving again: scheduler choose {_plain(league)} "
              f"--season {_plain(str(out_dir))} --option NUMBER")


@app.command(help="Re-write a season folder from another of its options, without solving "
             "again (the options are those plan listed, numbered as there).")
@_guarded
def choose(
    config: Annotated[Path, typer.Argument(help="The league file the season was planned from.")],
    season_dir: Annotated[
        Path, typer.Option("--season", help="The season folder written by plan.")
    ],
    option: Annotated[
        str, typer.Option("--option", help="The option's number as listed, or its label.")
    ],
) -> None:
    """Re-write a season folder from another of its options, without solving again.

    Parameters
    ----------
    config
        The league file the season was planned from.
    season_dir
        The season folder.
    option
        The option's number as listed, its label, or the start of one label.
    """
    from scheduler.config import load_league
    from scheduler.export import write_season_outputs
    from scheduler.fairness import compute_fairness
    from scheduler.fairness.names import plain_text
    from scheduler.plan import choose_option

    league = load_league(config)
    choice = choose_option(league, season_dir, option)
    fairness = compute_fairness(choice.season, league)
    written = write_season_outputs(
        choice.season, fairness, season_dir, config_path=config,
        game_minutes=league.calendar.game_minutes, side_labels=league.format.grid_labels)
    for number, figures in enumerate(choice.season.options, start=1):
        mark = "chosen" if figures.chosen else "kept"
        out.print(f"  {number}. {mark}: {_plain(plain_text(figures.label))}")
    if choice.number == choice.previous_number:
        out.print(f"option {choice.number} was already the chosen one; the folder was written "
                  "again unchanged")
    else:
        out.print(f"chose option {choice.number} ({_plain(choice.label)}) instead of option "
                  f"{choice.previous_number} ({_plain(choice.previous_label)}), without solving "
                  "again")
    out.print(f"wrote {len(written)} files to {season_dir}")


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
    method: Annotated[
        str, typer.Option(help="Divisions that share grounds or players: auto (one model for "
                          "them together, else one after another), joint or sequential.")
    ] = "auto",
) -> None:
    """Plan every division of a federation file (units of divisions in parallel, on Dask).
    \f
    Parameters
    ----------
    config
        The federation file.
    out_dir
        The output folder (one season folder per division and an index).
    workers
        Worker processes on this machine, when no ``cluster`` is given.
    cluster
        Address of a running Dask scheduler (``tcp://host:8786``).
    time_limit
        Solver seconds per division, overriding the file.
    force
        Replace an output folder that holds something else.
    quiet
        Print only the output folder.
    method
        How coupled divisions are planned (:data:`scheduler.divisions.plan.METHODS`).

    References
    ----------
    ``docs/divisions.md``.
    """
    _plan_federation(config, out_dir, workers=workers, cluster=cluster, time_limit=time_limit,
                     force=force, quiet=quiet, method=method)


@app.command()
@_guarded
def replan(
    config: Annotated[Path, typer.Argument(help="League config (.toml or .yaml).")],
    season_dir: Annotated[
        Path, typer.Option("--season", help="The season folder to re-plan (holds season.json).")
    ],
    events: Annotated[
        Path, typer.Option("--events", help="The season-events file (.toml or .yaml).")
    ],
    time_limit: Annotated[
        float | None, typer.Option(help="Solver time limit in seconds (overrides the config).")
    ] = None,
) -> None:
    """Re-plan a season after postponements, closures and withdrawals, changing as few games
    as possible; history never moves.
    \f
    Parameters
    ----------
    config
        The league file the season was planned from.
    season_dir
        The season folder to re-plan (holds ``season.json``); rewritten as a whole.
    events
        The season-events file (postponements, closures, withdrawals).
    time_limit
        Solver seconds, overriding the league file (positive).

    Raises
    ------
    InputError
        Unusable files or options (exit code 2).

    References
    ----------
    ``docs/replanning.md``.
    """
    from scheduler.replan import load_replan, write_replan

    if time_limit is not None and time_limit <= 0:
        raise InputError(f"--time-limit must be a positive number of seconds, got {time_limit}")
    result = load_replan(config, season_dir, events, time_limit=time_limit)
    assert result.league is not None
    if result.nothing_to_change:
        out.print(f"nothing to change: the season in {season_dir} already agrees with "
                  f"{events} (revision {result.season.revision}); nothing written")
        return
    written = write_replan(result, season_dir, league=result.league, config_path=config)
    repair = result.repair
    proof = ("the fewest possible (proven)" if repair.proven
             else f"not proven fewest: at least {repair.bound} are needed")
    out.print(f"[bold]{len(result.changes)}[/bold] game(s) changed; {repair.changed} re-planned "
              f"game(s) differ from the old plan, {proof}")
    if repair.goals:
        out.print("then, with that many changes: " + "; ".join(
            _plain(str(goal)) for goal in repair.goals))
    for change in result.changes:
        old, new = change.old, change.new
        before = f"{old.date} {old.start.strftime('%H:%M') if old.start else ''} {old.court or ''}"
        after = ("cancelled" if new is None else
                 f"{new.date} {new.start.strftime('%H:%M') if new.start else ''} "
                 f"{new.court or ''} ({new.home} at home)")
        out.print(f"  {change.kind}: {_plain(old.home)} v {_plain(old.away)} (round "
                  f"{old.round}): {_plain(before.strip())} -> {_plain(after.strip())}")
    if result.team_counts:
        out.print("changed games per team: " + ", ".join(
            f"{_plain(team)} {count}" for team, count in result.team_counts))
    if result.worsened:
        out.print("worse than before: " + "; ".join(_plain(str(w)) for w in result.worsened))
    else:
        out.print("no fairness figure got worse")
    _print_fairness(result.fairness, title=f"{result.season.league} {result.season.season_id}")
    out.print(f"wrote {len(written)} files to {season_dir}")


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
    columns: Annotated[
        str | None,
        typer.Option(
            help="Name the columns by hand, e.g. home=Heim,away=Gast,round=Spieltag,date=Datum "
            "(fields: round, leg, date, time, home, away, match, venue, court, slot)."
        ),
    ] = None,
    league_file: Annotated[
        Path | None,
        typer.Option("--league", help="League config whose hard rules the schedule must keep."),
    ] = None,
) -> None:
    """Check any schedule and print its fairness figures (exit 1 when it is invalid).
    \f
    Parameters
    ----------
    file
        The schedule: .csv, .xlsx or season.json.
    as_json
        Print one JSON object instead of text.
    report
        Also write the HTML fairness report to this file (never over a file of the user's).
    timezone
        IANA time zone of kick-off times written without a UTC offset.
    columns
        Columns named by hand, ``field=header`` pairs separated by commas.
    league_file
        A league file whose hard rules the schedule must also keep.

    Raises
    ------
    InputError
        An unusable schedule or option, with its location (exit code 2).

    References
    ----------
    ``docs/audit-input.md``.
    """
    from scheduler.audit import audit_file, parse_column_names
    from scheduler.config import load_league

    if report is not None:
        _check_report_path(report, file)
    league = load_league(league_file) if league_file is not None else None
    result = audit_file(file, timezone=timezone, columns=parse_column_names(columns),
                        league=league)
    if report is not None and result.fairness is not None:
        from scheduler.export.report import render_report
        from scheduler.files import atomic_write_text

        page = render_report(result.season, result.fairness)
        try:
            atomic_write_text(report, page)
        except OSError as exc:
            raise OutputError(
                f"--report: cannot write {report} ({exc.strerror or exc})"
            ) from None
    _Verdict.code = EXIT_OK if result.valid else EXIT_INVALID
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
            _print_rule_checks(result.fairness.rule_checks)
        if report is not None and result.fairness is not None:
            out.print(f"wrote {report}")
    raise typer.Exit(EXIT_OK if result.valid else EXIT_INVALID)


def _print_rule_checks(checks: Any) -> None:
    """The league's own hard rules: kept, or broken where and by whom (a few places each)."""
    if not checks:
        return
    out.print("rules of this league:")
    for check in checks:
        mark = "kept" if check.kept else f"BROKEN ({len(check.violations)}x)"
        out.print(f"  {mark}: {_plain(check.statement)}")
        for v in check.violations[:5]:
            where = ", ".join(x for x in (f"round {v.round}" if v.round else "",
                                          v.date.isoformat() if v.date else "") if x)
            out.print(f"    - {_plain(v.team)} ({where}): {_plain(v.what)}")


def _check_report_path(report: Path, audited: Path) -> None:
    """Refuse a ``--report`` place that cannot take a file, before any work is done."""
    if report.is_dir():
        example = report / "report.html"
        raise OutputError(
            f"--report: {report} is a folder; give a file name, for example {example}"
        )
    folder = report.parent if str(report.parent) else Path(".")
    if not folder.is_dir():
        what = "is not a folder" if folder.exists() else "does not exist"
        raise OutputError(f"--report: the folder {folder} {what}")
    if not os.access(folder, os.W_OK):
        raise OutputError(f"--report: the folder {folder} is not writable")
    try:
        same = report.resolve() == audited.resolve() or (
            report.exists() and report.samefile(audited)
        )
    except OSError:
        same = False
    if same:
        raise InputError("--report would overwrite the audited file", location=str(report))


def _print_fairness(fairness: Any, *, title: str) -> None:
    """The measured figures as a table, named as in every other output
    (:mod:`scheduler.fairness.names`); the full set is in season.json and the report."""
    from scheduler.fairness.names import figure_lines

    table = Table(title=f"Fairness: {_plain(title)}", show_header=True, header_style="bold")
    table.add_column("figure")
    table.add_column("value", justify="right")
    table.add_column("where it stands")
    table.add_column("measured over")
    table.add_row("teams", str(fairness.teams), "", "")
    table.add_row("rounds", str(fairness.rounds), "", "")
    for line in figure_lines(fairness):
        table.add_row(line.name, line.value, _plain(line.brief), _plain(line.over_brief))
    out.print(table)



def _plan_federation(config: Path, out_dir: Path, *, workers: int, cluster: str | None,
                     time_limit: float | None, force: bool, quiet: bool,
                     method: str = "auto") -> None:
    """Plan every division of a federation file and write its folder (``plan`` and
    ``plan-divisions`` share this)."""
    from scheduler.config.federation import load_federation
    from scheduler.divisions.execute import plan_federation
    from scheduler.divisions.outputs import write_federation_outputs
    from scheduler.divisions.plan import METHODS

    if time_limit is not None and time_limit <= 0:
        raise InputError(f"--time-limit must be a positive number of seconds, got {time_limit}")
    if method not in METHODS:
        raise InputError(f"--method must be one of {', '.join(METHODS)}, got {method!r}",
                         location="--method")
    federation = load_federation(config)
    with _progress(not quiet) as progress:
        result = plan_federation(federation, workers=workers, cluster=cluster,
                                 time_limit=time_limit, progress=progress, method=method)
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


def _one_line_summaries() -> None:
    """Give every command a one-line summary for the command list of ``scheduler --help``.

    The list shows the first paragraph of a command's help with its line breaks kept; the
    summary is that paragraph (the text before the contributor notes after ``\\f``) on one
    line, so the docstring stays the one place it is written.
    """
    for command in app.registered_commands:
        if command.short_help is None and command.callback is not None:
            text = command.help or inspect.getdoc(command.callback) or ""
            first = text.partition("\f")[0].strip().split("\n\n")[0]
            command.short_help = " ".join(first.split())


_one_line_summaries()


def main() -> None:
    """Console entry point."""
    from scheduler.interrupt import sticky_interrupts

    code: Any = EXIT_OK
    try:
        with sticky_interrupts():
            app()
    except SystemExit as exc:
        code = exc.code
        raise
    finally:
        try:
            sys.stdout.flush()
        except (BrokenPipeError, ValueError):
            _silence_stdout()
        if code == EXIT_INTERRUPTED:
            # Some libraries print and drop a KeyboardInterrupt (numba's compiler callbacks);
            # Python would then end the process by SIGINT instead of the documented 130.
            sys.stderr.flush()
            os._exit(EXIT_INTERRUPTED)


if __name__ == "__main__":
    main()
