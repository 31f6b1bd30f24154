"""Breaks, home counts and the break lower bounds.

Sources: D. de Werra, "Scheduling in sports", Annals of Discrete Mathematics 11 (1981)
381-395 (n-2 for an even SRR, at most two break-free teams; 3n-6 for a mirrored DRR); the
derivations in docs/leg-schemes.md for the canonical schedule's check values, the odd
leagues and the French / English / inverted bounds, which are
re-checked here by exhaustive search over every timetable and venue choice for n = 4 and 6.
"""

from __future__ import annotations

import itertools

import numpy as np
import pytest

from scheduler.fairness import compute_fairness
from scheduler.fairness.breaks import breaks_lower_bound, count_breaks
from tests.fairness.constructions import (
    canonical_rounds,
    double_round_robin,
    odd_from_even,
    ref_breaks,
    season_of,
    sigma,
)

EVEN = list(range(4, 21, 2))


@pytest.mark.parametrize("n", EVEN)
def test_canonical_srr_has_n_minus_2_breaks_and_two_break_free_teams(n):
    """de Werra 1981: the canonical schedule reaches the minimum n-2; exactly 2 teams have no
    break and every other team exactly one (notes, check values n = 4..20)."""
    rounds = canonical_rounds(n)
    report = compute_fairness(season_of(rounds, n))
    assert report.breaks_total == n - 2
    assert sorted(report.breaks_per_team) == [0, 0] + [1] * (n - 2)
    assert list(report.breaks_per_team) == ref_breaks(rounds, n)
    assert report.breaks_lower_bound == n - 2
    assert "de Werra" in report.breaks_lower_bound_source
    assert set(report.home_counts) <= {(n - 2) // 2, n // 2}
    assert report.home_gap_max == 2
    assert report.scheme == "single"


@pytest.mark.parametrize("n", EVEN)
def test_canonical_mirrored_drr_has_3n_minus_6_breaks(n):
    """de Werra 1981: 3n-6 for the mirrored double round robin (n=4: 6, 6: 12, 8: 18, 10: 24,
    20: 54 in the notes); home-count gap 2 in the DRR too."""
    rounds = double_round_robin(canonical_rounds(n), "mirrored")
    report = compute_fairness(season_of(rounds, n, legs=2))
    assert report.breaks_total == 3 * n - 6
    assert report.scheme == "mirrored"
    assert report.breaks_lower_bound == 3 * n - 6
    assert report.home_gap_max == 2


def test_mirrored_check_values_from_the_notes():
    """Explicit values listed in the notes (de Werra's 3n-6)."""
    for n, expected in ((4, 6), (6, 12), (8, 18), (10, 24), (20, 54)):
        rounds = double_round_robin(canonical_rounds(n), "mirrored")
        assert compute_fairness(season_of(rounds, n, legs=2)).breaks_total == expected


@pytest.mark.parametrize("n", [3, 5, 7, 9, 11, 13, 15, 17, 19])
def test_odd_league_with_fixed_team_as_dummy(n):
    """Notes section 1 (computed, n = 3..19): with the fixed team of the (n+1)-team canonical
    schedule as the dummy, the SRR has 0 breaks and the mirrored DRR n breaks, byes skipped."""
    srr = odd_from_even(canonical_rounds(n + 1), dummy=n + 1)
    report = compute_fairness(season_of(srr, n))
    assert report.breaks_total == 0
    assert report.breaks_lower_bound == 0
    assert "skipped" in report.bye_convention
    drr = double_round_robin(srr, "mirrored")
    report2 = compute_fairness(season_of(drr, n, legs=2))
    assert report2.breaks_total == n == report2.breaks_lower_bound
    assert list(report2.breaks_per_team) == ref_breaks(drr, n)


def _min_breaks_all_schedules(n: int) -> dict[str, int]:
    """Exhaustive minimum total breaks per scheme over every SRR timetable of n teams (every
    round order of the one 1-factorization, which is unique up to isomorphism for n = 4, 6:
    Wallis, One-Factorizations, 1997; relabelling teams does not change the total) and every
    venue choice (plain enumeration, vectorised over the venue choices)."""
    base = canonical_rounds(n)
    games = [tuple(g) for rnd in base for g in rnd]
    g_count = len(games)
    m = n - 1
    # bits[c, g] = 1 when game g is flipped in choice c; fix game 0 (a global flip changes
    # nothing), so 2^(g-1) choices.
    choices = np.arange(1 << (g_count - 1), dtype=np.int64)
    bits = ((choices[:, None] >> np.arange(g_count - 1)) & 1).astype(np.int8)
    bits = np.concatenate([np.zeros((len(choices), 1), dtype=np.int8), bits], axis=1)
    best = {s: 10**9 for s in ("single", "mirrored", "french", "english", "inverted")}
    round_of_game = [r for r, rnd in enumerate(base) for _ in rnd]
    for order in itertools.permutations(range(m)):
        position = {r: p for p, r in enumerate(order)}
        # venue[c, p, t]: +1 home, -1 away for team t at leg-1 position p
        venue = np.zeros((len(choices), m, n), dtype=np.int8)
        for g, (h, a) in enumerate(games):
            p = position[round_of_game[g]]
            flip = bits[:, g]
            venue[:, p, h - 1] = np.where(flip, -1, 1)
            venue[:, p, a - 1] = np.where(flip, 1, -1)
        leg1 = (venue[:, 1:] == venue[:, :-1]).sum(axis=(1, 2))
        best["single"] = min(best["single"], int(leg1.min()))
        for scheme in ("mirrored", "french", "english", "inverted"):
            leg2 = -venue[:, sigma(scheme, m)]
            full = np.concatenate([venue, leg2], axis=1)
            total = (full[:, 1:] == full[:, :-1]).sum(axis=(1, 2))
            best[scheme] = min(best[scheme], int(total.min()))
    return best


@pytest.mark.parametrize("n", [4, 6])
def test_lower_bounds_equal_exhaustive_minimum(n):
    """The bounds used in the report (de Werra n-2 and 3n-6; French 2n, English and inverted
    2n-4 from docs/leg-schemes.md: n=4: 2, 6, 8, 4, 4; n=6: 4, 12, 12, 8, 8) are the exact
    minima."""
    best = _min_breaks_all_schedules(n)
    table = {4: (2, 6, 8, 4, 4), 6: (4, 12, 12, 8, 8)}[n]
    assert tuple(best[s] for s in ("single", "mirrored", "french", "english", "inverted")) == table
    assert breaks_lower_bound(n, 1, "single")[0] == best["single"]
    for scheme in ("mirrored", "french", "english", "inverted"):
        assert breaks_lower_bound(n, 2, scheme)[0] == best[scheme], scheme


@pytest.mark.parametrize("scheme", ["french", "english", "inverted"])
@pytest.mark.parametrize("n", [6, 8, 10])
def test_scheme_detected_and_bound_holds(scheme, n):
    """Any DRR of the scheme has at least the derived bound (French >= 2n, English/inverted >=
    2n-4, notes section 4); the canonical schedule's legs are recognised by their index map."""
    rounds = double_round_robin(canonical_rounds(n), scheme)
    report = compute_fairness(season_of(rounds, n, legs=2, scheme=scheme))
    assert report.scheme == scheme
    assert report.breaks_total >= report.breaks_lower_bound
    assert report.breaks_lower_bound == (2 * n if scheme == "french" else 2 * n - 4)
    assert report.breaks_total == sum(ref_breaks(rounds, n))


def test_count_breaks_skips_byes():
    """Bye convention: H, bye, H is one break (counted in the third round); H A is none."""
    sign = np.array([[1, 1], [0, -1], [1, -1]], dtype=np.int8)
    per_team, mask = count_breaks(sign)
    assert per_team.tolist() == [1, 1]
    assert mask[:, 0].tolist() == [False, False, True]
    assert mask[:, 1].tolist() == [False, False, True]


def test_break_rounds_and_pattern():
    """A team's pattern and break rounds, checked by hand on the 4-team canonical schedule."""
    rounds = canonical_rounds(4)
    report = compute_fairness(season_of(rounds, 4))
    for fig in report.team_figures:
        pattern = fig.pattern
        breaks = [r + 1 for r in range(1, len(pattern)) if pattern[r] == pattern[r - 1]]
        assert list(fig.break_rounds) == breaks
        assert fig.home == pattern.count("H") and fig.away == pattern.count("A")


@pytest.mark.parametrize("n", [3, 5])
def test_odd_mirrored_minimum_is_n_by_exhaustive_search(n):
    """Notes section 1 (proved there): an odd mirrored DRR with byes skipped has at least n
    breaks, and n is reached; an odd SRR can have 0. Search: every round order of the (n+1)-team
    factorization, every choice of the bye vertex, every venue choice."""
    base = canonical_rounds(n + 1)
    m = n
    best_srr = best_drr = 10**9
    for dummy in range(1, n + 2):
        games = [(r, h, a) for r, rnd in enumerate(base) for h, a in rnd if dummy not in (h, a)]
        g_count = len(games)
        choices = np.arange(1 << g_count, dtype=np.int64)
        bits = ((choices[:, None] >> np.arange(g_count)) & 1).astype(bool)
        for order in itertools.permutations(range(m)):
            position = {r: p for p, r in enumerate(order)}
            venue = np.zeros((len(choices), m, n + 2), dtype=np.int8)
            for g, (r, h, a) in enumerate(games):
                p = position[r]
                venue[:, p, h] = np.where(bits[:, g], -1, 1)
                venue[:, p, a] = np.where(bits[:, g], 1, -1)
            full = np.concatenate([venue, -venue], axis=1)
            for seq, is_drr in ((venue, False), (full, True)):
                total = np.zeros(len(choices), dtype=np.int64)
                for t in range(1, n + 2):
                    if t == dummy:
                        continue
                    played = seq[:, :, t]
                    # drop the bye round (the same position in every choice)
                    cols = np.flatnonzero(played[0] != 0)
                    s_t = played[:, cols]
                    total += (s_t[:, 1:] == s_t[:, :-1]).sum(axis=1)
                if is_drr:
                    best_drr = min(best_drr, int(total.min()))
                else:
                    best_srr = min(best_srr, int(total.min()))
    assert best_srr == 0 == breaks_lower_bound(n, 1, "single")[0]
    assert best_drr == n == breaks_lower_bound(n, 2, "mirrored")[0]


@pytest.mark.parametrize("n", [4, 8, 12])
def test_longest_runs(n):
    """The canonical schedule has at most one break per team, so no run is longer than 2
    (de Werra 1981); runs are checked against the HAP strings by hand (byes skipped)."""
    rounds = double_round_robin(canonical_rounds(n), "mirrored")
    report = compute_fairness(season_of(rounds, n, legs=2))
    for fig in report.team_figures:
        played = fig.pattern.replace("B", "")
        runs = [len(x) for x in played.replace("HA", "H A").replace("AH", "A H").split()]
        homes = [len(x) for x in played.replace("A", " ").split()]
        aways = [len(x) for x in played.replace("H", " ").split()]
        assert fig.home_run_max == max(homes) and fig.away_run_max == max(aways)
        assert max(runs) == max(fig.home_run_max, fig.away_run_max)
    srr = compute_fairness(season_of(canonical_rounds(n), n))
    assert max(srr.home_run_max, srr.away_run_max) == 2
