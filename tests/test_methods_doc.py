"""docs/methods.md against the citations that point into it.

What is checked:

* docs/methods.md is in the repository and has a heading for each of §1 to §11, on the topics the
  citations were written against (Nagaoka, Wheeler/Lundin with §2a-§2c, Rosa, multilayer/Brooks/spiral,
  Maxwell's circles, self-capacitance, copper/AWG/enamel, IEC 60205 toroids and gaps, ferrite rods, LC
  resonance, skin and proximity effect), each section number once;
* every citation "methods.md §X" in the .py files of coilplan/ and tests/ (and the notes in core_data/),
  lists such as "§1, §3 and §5" and citations broken across a line included, names a section X that
  is a heading in docs/methods.md;
* no file of coilplan/, tests/, core_data/, README.md or DEVELOPERS.md still cites the background file
  the citations used to point to (its name is assembled below, so this file does not cite it either).

The files are read from the repository (located from this file), not from the installed package.
"""

import re
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
DOC = ROOT / "docs" / "methods.md"
OLD_NAME = "references" + ".md"

#: A section heading: "## §10 ..." or "### §2a ...".
HEADING = re.compile(r"^#{2,4}[ \t]+§(\d+[a-z]?)(?![0-9a-z])(.*)$", re.MULTILINE)
#: A citation: "methods.md" (perhaps closed by a backtick) and one or more "§X", separated by commas,
#: "and", spaces, line breaks and comment marks.
CITATION = re.compile(r"methods\.md`?((?:[\s#]*(?:,|and)?[\s#]*§\d+[a-z]?(?![0-9a-z]))+)")
SECTION = re.compile(r"§(\d+[a-z]?)")

#: The topic each of §1 to §11 must keep (a word of its heading), as the existing citations expect.
TOPICS = {
    "1": "Nagaoka", "2": "Wheeler", "2a": "Wheeler 1928", "2b": "Wheeler 1982", "2c": "Lundin",
    "3": "Rosa", "4": "Brooks", "5": "Maxwell", "6": "Self-capacitance", "7": "AWG", "8": "IEC 60205",
    "9": "rod", "10": "LC", "11": "Skin",
}


def headings() -> dict[str, str]:
    """Section number -> heading text of docs/methods.md (fails on a section number used twice)."""
    found = HEADING.findall(DOC.read_text(encoding="utf-8"))
    numbers = [number for number, _ in found]
    assert len(numbers) == len(set(numbers)), sorted(n for n in numbers if numbers.count(n) > 1)
    return {number: text for number, text in found}


def cited_sections(text: str) -> list[str]:
    """Every section X of every "methods.md §X" citation in ``text``, in order."""
    return [section for match in CITATION.finditer(text) for section in SECTION.findall(match.group(1))]


def citing_files() -> list[Path]:
    """The sources whose citations must resolve: .py under coilplan/ and tests/, notes under core_data/."""
    return (sorted((ROOT / "coilplan").rglob("*.py")) + sorted((ROOT / "tests").rglob("*.py"))
            + sorted((ROOT / "core_data").rglob("*.md")))


def test_citation_pattern_reads_lists_line_breaks_and_backticks():
    """The collector finds each form of citation used in the sources, and nothing past it (hand-written cases)."""
    assert cited_sections("see docs/methods.md §1, §3 and §5 (computed there)") == ["1", "3", "5"]
    assert cited_sections("as in docs/methods.md\n    §11b). For round wire") == ["11b"]
    assert cited_sections("# formula as in docs/methods.md\n# §2a: Wheeler") == ["2a"]
    assert cited_sections("`docs/methods.md` §7d also flags these rows") == ["7d"]
    assert cited_sections("# docs/methods.md §10: 102.014 µH, §5 of another file") == ["10"]
    assert cited_sections("docs/methods.md describes every method") == []


def test_methods_doc_keeps_sections_one_to_eleven_on_their_topics():
    """§1-§11 and §2a-§2c are headings of docs/methods.md, each on the topic the citations expect."""
    assert DOC.is_file(), DOC
    sections = headings()
    for number, word in TOPICS.items():
        assert number in sections, f"§{number} has no heading in docs/methods.md"
        assert word.lower() in sections[number].lower(), (number, sections[number])


def test_every_cited_section_is_a_heading_of_the_methods_doc():
    """Each "methods.md §X" in coilplan/, tests/ and core_data/ names a section X that docs/methods.md has."""
    sections = headings()
    assert "99" not in sections  # a citation of §99 would be reported below
    missing, counts = [], {"coilplan": 0, "tests": 0}
    for path in citing_files():
        text = path.read_text(encoding="utf-8")
        for match in CITATION.finditer(text):
            line = text.count("\n", 0, match.start()) + 1
            for section in SECTION.findall(match.group(1)):
                top = path.relative_to(ROOT).parts[0]
                counts[top] = counts.get(top, 0) + 1
                if section not in sections:
                    missing.append(f"{path.relative_to(ROOT)}:{line}: §{section}")
    assert counts["coilplan"] > 0 and counts["tests"] > 0, counts  # the collector found the citations at all
    assert missing == [], "cited sections without a heading in docs/methods.md:\n" + "\n".join(missing)


def test_nothing_cites_the_old_background_file():
    """No text file of coilplan/, tests/, core_data/, README.md or DEVELOPERS.md names the old background file."""
    suffixes = {".py", ".md", ".csv", ".toml", ".txt", ".json", ".cfg"}
    paths = [ROOT / "README.md", ROOT / "DEVELOPERS.md"]
    for folder in ("coilplan", "tests", "core_data"):
        paths += sorted(path for path in (ROOT / folder).rglob("*") if path.suffix in suffixes and path.is_file())
    offenders = [f"{path.relative_to(ROOT)}:{number}"
                 for path in paths
                 for number, line in enumerate(path.read_text(encoding="utf-8").splitlines(), start=1)
                 if OLD_NAME in line]
    assert offenders == [], "still citing the old file: " + ", ".join(offenders)
