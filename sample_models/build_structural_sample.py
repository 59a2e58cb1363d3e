"""Build the Quillfeather Annex sample model, with its IFC structural-analysis model, byte-identically.

The Quillfeather Annex is an invented two-storey extension of the invented Quillfeather Studio
(see README.md beside this file): a bindery on the ground floor and a drying loft above, with a
small balcony. ``quillfeather_annex_structural.ifc`` (IFC4; foot, lbf, lbf/ft) holds five timber
members of its loft floor and loft wall, each as a physical ``IfcBeam`` (body, axis, material,
``ifccheck_DesignInput``) and as an ``IfcStructuralCurveMember`` of one
``IfcStructuralAnalysisModel`` that carries the member's supports and loads:

* J-A-01, a two-span continuous floor joist under uniform dead and live load;
* G-A-01, a simply supported girder under joist reactions at 2 ft, and J-A-02 framing in at mid-span;
* BJ-A-01, a balcony joist with a back span and an overhang under uniform load;
* HDR-A-01, a header under one post load (dead and snow);
* J-A-02, a store-room joist from the north wall to the girder's mid-span under uniform load, whose
  end node is a point connection of the girder's curve member (no boundary condition): the girder
  carries it.

Usage: ``python sample_models/build_structural_sample.py [OUT_DIR]`` (default: this folder).

Member data below are in inches (positions, sizes) and lbf/ft (plf) or lbf; the model writes them
in feet. The expected verdicts and their hand calculations are in README.md.
"""

from __future__ import annotations

import argparse
import math
import sys
from dataclasses import dataclass
from pathlib import Path

import ifcopenshell
import ifcopenshell.api.aggregate
import ifcopenshell.api.context
import ifcopenshell.api.root
import ifcopenshell.guid

HERE = Path(__file__).resolve().parent
if str(HERE) not in sys.path:  # build_samples.py sits beside this file and is not in a package
    sys.path.insert(0, str(HERE))

from build_samples import (  # noqa: E402 - after the path set-up above
    ADDRESS_LINES,
    DFL1,
    DFL2,
    IMPERIAL,
    P2PLY_2X12,
    P2X10,
    TOWN,
    MemberSpec,
    Profile,
    SampleBuilder,
    UnitSystem,
)

FILE_NAME = "quillfeather_annex_structural.ifc"
UNITS = UnitSystem(FILE_NAME, "IFC4", IMPERIAL.per_inch, IMPERIAL.per_plf, IMPERIAL.per_psf, IMPERIAL.units)
PREPROCESSOR = "ifccheck sample_models/build_structural_sample.py"

ANNEX_NAME = "Quillfeather Annex"
ANNEX_DESCRIPTION = (
    "Invented sample: a bindery with a drying loft and balcony, added to the fictional Quillfeather "
    "Studio of the Inkwell and Loom Makers' Guild. Not a real building, client or site."
)
ANNEX_STOREYS = (("Ground Floor", 0.0), ("Upper Floor", 120.0))

P2PLY_2X10 = Profile("2x10", 1.5, 9.25, plies=2)
P2X12 = Profile("2x12", 1.5, 11.25)

# ------------------------------------------------------------------------------------------
# Load cases, supports and loads (positions in inches along the member from its start)
# ------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class LoadCaseSpec:
    """An IfcStructuralLoadCase: our load type letter and the IFC action type and source."""

    load_type: str
    name: str
    action_type: str
    action_source: str


LOAD_CASES = (
    LoadCaseSpec("D", "D dead load", "PERMANENT_G", "DEAD_LOAD_G"),
    LoadCaseSpec("L", "L floor live load", "VARIABLE_Q", "LIVE_LOAD_Q"),
    LoadCaseSpec("S", "S snow load", "VARIABLE_Q", "SNOW_S"),
)


@dataclass(frozen=True)
class SupportSpec:
    """A support at ``x`` along the member: "pinned" holds the three translations, "roller" only
    the vertical one; neither holds a rotation (a simple support in the bending plane)."""

    x: float
    kind: str
    description: str


@dataclass(frozen=True)
class LineLoadSpec:
    """A uniform line load ``w`` (plf, downward) of a load type over the whole member."""

    load_type: str
    w: float


@dataclass(frozen=True)
class PointLoadSpec:
    """A concentrated load ``P`` (lbf, downward) of a load type at ``x`` along the member."""

    load_type: str
    x: float
    P: float


@dataclass(frozen=True)
class JointSpec:
    """A point connection without a boundary condition where the end of member ``carried`` frames
    into member ``carrier`` at ``x`` along the carrier."""

    carried: str
    carrier: str
    x: float
    description: str


@dataclass(frozen=True)
class AnalysedMember:
    """A physical member and what its structural-analysis member carries."""

    member: MemberSpec
    supports: tuple
    line_loads: tuple = ()
    point_loads: tuple = ()


FLOOR_Z = 120.0  # top of the loft floor framing (in)
JOIST_Z = FLOOR_Z - P2X10.d / 2
BRACED_JOIST = {"SelfWeightIncluded": True, "ContinuouslyBraced": True, "BearingLength": 3.5}

# 10 psf dead and 40 psf live at 16 in o.c.: 13.33 and 53.33 plf
JOIST_RUN = AnalysedMember(
    MemberSpec(
        "J-A-01", "IfcBeam", "JOIST", "Upper Floor", P2X10, (0.0, 16.0, JOIST_Z), (288.0, 16.0, JOIST_Z),
        "Loft floor joist, south bay, continuous over the bearing wall at x = 12 ft",
        material=DFL2, inputs=BRACED_JOIST,
    ),
    supports=(
        SupportSpec(0.0, "pinned", "west wall"),
        SupportSpec(144.0, "roller", "interior bearing wall"),
        SupportSpec(288.0, "roller", "east wall"),
    ),
    line_loads=(LineLoadSpec("D", 10.0 * 16 / 12), LineLoadSpec("L", 40.0 * 16 / 12)),
)

# reactions of 8 ft store-room joists at 24 in o.c.: 10 psf x 2 ft x 4 ft and 40 psf x 2 ft x 4 ft
GIRDER_REACTION_D = 80.0
GIRDER_REACTION_L = 320.0
GIRDER_Z = FLOOR_Z - P2PLY_2X12.d / 2
GIRDER_MID = 72.0  # where J-A-02 frames in; the other store-room joists are loads
GIRDER = AnalysedMember(
    MemberSpec(
        "G-A-01", "IfcBeam", "BEAM", "Upper Floor", P2PLY_2X12,
        (72.0, 144.0, GIRDER_Z), (216.0, 144.0, GIRDER_Z),
        "Flush girder of the store-room floor between the posts at x = 6 ft and 18 ft, "
        "carrying 8 ft joists at 24 in from the north",
        material=DFL1, inputs={"SelfWeightIncluded": True, "UnbracedLength": 24.0},
    ),
    supports=(SupportSpec(0.0, "pinned", "west post"), SupportSpec(144.0, "roller", "east post")),
    point_loads=tuple(
        PointLoadSpec(load_type, x, P)
        for load_type, P in (("D", GIRDER_REACTION_D), ("L", GIRDER_REACTION_L))
        for x in (24.0, 48.0, 96.0, 120.0)
    ),
)

# the store-room joist at the girder's mid-span, 2x12 flush with the girder (same axis height), from
# the north wall to the girder's axis: 8 ft at 24 in o.c., 10 psf dead and 40 psf live: 20 and 80 plf
STORE_JOIST = AnalysedMember(
    MemberSpec(
        "J-A-02", "IfcBeam", "JOIST", "Upper Floor", P2X12, (144.0, 240.0, GIRDER_Z), (144.0, 144.0, GIRDER_Z),
        "Store-room floor joist from the north wall to the girder G-A-01 at its mid-span, in a joist hanger",
        material=DFL2, inputs=BRACED_JOIST,
    ),
    supports=(SupportSpec(0.0, "pinned", "north wall"),),
    line_loads=(LineLoadSpec("D", 10.0 * 24 / 12), LineLoadSpec("L", 40.0 * 24 / 12)),
)

# 15 psf dead and 60 psf balcony live at 16 in o.c.: 20 and 80 plf
BALCONY_JOIST = AnalysedMember(
    MemberSpec(
        "BJ-A-01", "IfcBeam", "JOIST", "Upper Floor", P2X10, (168.0, 80.0, JOIST_Z), (336.0, 80.0, JOIST_Z),
        "Balcony joist: 10 ft back span from the balcony trimmer to the east wall, 4 ft overhang",
        material=DFL2, inputs=BRACED_JOIST,
    ),
    supports=(SupportSpec(0.0, "pinned", "balcony trimmer at x = 14 ft"), SupportSpec(120.0, "roller", "east wall")),
    line_loads=(LineLoadSpec("D", 15.0 * 16 / 12), LineLoadSpec("L", 60.0 * 16 / 12)),
)

# the ridge post: 120 ft2 of roof at 15 psf dead and 25 psf snow
HEADER_Z = 216.0 - 3.0 - P2PLY_2X10.d / 2  # under the double top plate of the 8 ft loft wall
HEADER = AnalysedMember(
    MemberSpec(
        "HDR-A-01", "IfcBeam", "LINTEL", "Upper Floor", P2PLY_2X10,
        (120.0, 238.25, HEADER_Z), (192.0, 238.25, HEADER_Z),
        "Header over the 6 ft loft window in the north gable wall, carrying the ridge post",
        material=DFL2,
        inputs={"SelfWeightIncluded": True, "ContinuouslyBraced": True, "BearingLength": 3.0},
    ),
    supports=(SupportSpec(0.0, "pinned", "west jamb studs"), SupportSpec(72.0, "roller", "east jamb studs")),
    point_loads=(PointLoadSpec("D", 24.0, 1800.0), PointLoadSpec("S", 24.0, 3000.0)),
)

ANALYSED_MEMBERS = (JOIST_RUN, GIRDER, BALCONY_JOIST, HEADER, STORE_JOIST)
JOINTS = (JointSpec("J-A-02", "G-A-01", GIRDER_MID, "joist hanger of J-A-02 at the girder's mid-span"),)

# ------------------------------------------------------------------------------------------
# The model
# ------------------------------------------------------------------------------------------


def point_along(spec: MemberSpec, x: float) -> tuple:
    """World coordinates (in) of the point ``x`` inches along the member's axis from its start."""
    length = math.dist(spec.start, spec.end)
    return tuple(s + (e - s) * x / length for s, e in zip(spec.start, spec.end))


class StructuralSampleBuilder(SampleBuilder):
    """The Quillfeather Annex: physical members as in the studio models, plus one
    IfcStructuralAnalysisModel whose curve members carry the supports and loads."""

    preprocessor = PREPROCESSOR

    def __init__(self):
        super().__init__(UNITS)  # foot, lbf and lbf/ft: loads below are written in these units
        self.project.Name = ANNEX_NAME
        self.project.Description = ANNEX_DESCRIPTION
        root = self.geometry.body.ParentContext
        self.reference = ifcopenshell.api.context.add_context(
            self.model, context_type="Model", context_identifier="Reference", target_view="GRAPH_VIEW", parent=root
        )
        self.conditions = {}
        self.case_actions = {case.load_type: [] for case in LOAD_CASES}
        self.vertices = {}  # world position (in) -> its one IfcVertexPoint, shared by all its users

    def add_spatial_structure(self) -> dict:
        """Project → site → building → storeys, as in the studio models but with the annex's names."""
        site = ifcopenshell.api.root.create_entity(self.model, "IfcSite", name=f"{ANNEX_NAME} site")
        self.building = ifcopenshell.api.root.create_entity(self.model, "IfcBuilding", name=ANNEX_NAME)
        self.building.BuildingAddress = self.model.create_entity(
            "IfcPostalAddress", Purpose="SITE", AddressLines=ADDRESS_LINES, Town=TOWN
        )
        ifcopenshell.api.aggregate.assign_object(self.model, products=[site], relating_object=self.project)
        ifcopenshell.api.aggregate.assign_object(self.model, products=[self.building], relating_object=site)
        site.ObjectPlacement = self.geometry.world_placement()
        self.building.ObjectPlacement = self.geometry.world_placement()
        storeys = {}
        for name, elevation in ANNEX_STOREYS:
            storey = ifcopenshell.api.root.create_entity(self.model, "IfcBuildingStorey", name=name)
            ifcopenshell.api.aggregate.assign_object(self.model, products=[storey], relating_object=self.building)
            storey.Elevation = self.geometry.length(elevation)
            storey.ObjectPlacement = self.geometry.world_placement((0.0, 0.0, elevation))
            storeys[name] = storey
        return storeys

    def rooted(self, ifc_class: str, **attributes):
        """An IfcRoot entity; its GlobalId is replaced by a fixed one in fix_global_ids."""
        return self.model.create_entity(ifc_class, GlobalId=ifcopenshell.guid.new(), **attributes)

    def add_analysis_model(self):
        """The analysis model, its placement shared by all its items, and its load cases."""
        self.shared_placement = self.geometry.world_placement()
        self.load_cases = {
            case.load_type: self.rooted(
                "IfcStructuralLoadCase", Name=case.name, PredefinedType="LOAD_CASE", ActionType=case.action_type,
                ActionSource=case.action_source, SelfWeightCoefficients=(0.0, 0.0, 0.0),
            )
            for case in LOAD_CASES
        }
        analysis = self.rooted(
            "IfcStructuralAnalysisModel", Name=f"{ANNEX_NAME} loft framing",
            Description="Each timber member of the loft floor and wall in its vertical bending plane",
            PredefinedType="LOADING_3D", LoadedBy=list(self.load_cases.values()),
            SharedPlacement=self.shared_placement,
        )
        self.rooted("IfcRelServicesBuildings", RelatingSystem=analysis, RelatedBuildings=[self.building])
        return analysis

    def condition(self, kind: str):
        """The boundary condition of a support kind (IFC4 booleans: TRUE = held, FALSE = free)."""
        if kind not in self.conditions:
            held = {"pinned": (True, True, True), "roller": (False, False, True)}[kind]
            translations = [self.model.create_entity("IfcBoolean", h) for h in held]
            rotations = [self.model.create_entity("IfcBoolean", False) for _ in range(3)]
            self.conditions[kind] = self.model.create_entity(
                "IfcBoundaryNodeCondition", Name=kind,
                TranslationalStiffnessX=translations[0], TranslationalStiffnessY=translations[1],
                TranslationalStiffnessZ=translations[2], RotationalStiffnessX=rotations[0],
                RotationalStiffnessY=rotations[1], RotationalStiffnessZ=rotations[2],
            )
        return self.conditions[kind]

    def topology_shape(self, representation_type: str, item):
        representation = self.model.create_entity(
            "IfcTopologyRepresentation", ContextOfItems=self.reference, RepresentationIdentifier="Reference",
            RepresentationType=representation_type, Items=[item],
        )
        return self.model.create_entity("IfcProductDefinitionShape", Representations=[representation])

    def vertex(self, spec: MemberSpec, x: float):
        """The IfcVertexPoint at ``x`` along a member: one per position in the model, shared by its users."""
        position = point_along(spec, x)
        if position not in self.vertices:
            world = [self.geometry.length(c) for c in position]
            self.vertices[position] = self.model.create_entity("IfcVertexPoint", self.geometry.point(world))
        return self.vertices[position]

    def add_structural_member(self, analysed: AnalysedMember, beam) -> list:
        """The curve member of one physical member with its supports and actions; returns the
        curve member and its point connections (the items of the analysis model's group)."""
        spec = analysed.member

        def vertex(x: float):
            return self.vertex(spec, x)

        edge = self.model.create_entity("IfcEdge", vertex(0.0), vertex(math.dist(spec.start, spec.end)))
        curve_member = self.rooted(
            "IfcStructuralCurveMember", Name=spec.name, Description=spec.description,
            ObjectPlacement=self.shared_placement, Representation=self.topology_shape("Edge", edge),
            PredefinedType="RIGID_JOINED_MEMBER", Axis=self.geometry.direction((0.0, 0.0, 1.0)),
        )
        self.rooted("IfcRelAssignsToProduct", RelatedObjects=[curve_member], RelatingProduct=beam)
        connections = [self.add_support(spec.name, number, support, curve_member, vertex(support.x))
                       for number, support in enumerate(analysed.supports, start=1)]
        for load in analysed.line_loads:
            self.add_line_load(spec.name, load, curve_member)
        for load in analysed.point_loads:
            self.add_point_load(spec.name, load, curve_member, vertex(load.x))
        return [curve_member, *connections]

    def add_support(self, member_name: str, number: int, support: SupportSpec, curve_member, vertex):
        connection = self.rooted(
            "IfcStructuralPointConnection", Name=f"{member_name} support {number}", Description=support.description,
            ObjectPlacement=self.shared_placement, Representation=self.topology_shape("Vertex", vertex),
            AppliedCondition=self.condition(support.kind),
        )
        self.rooted(
            "IfcRelConnectsStructuralMember",
            RelatingStructuralMember=curve_member, RelatedStructuralConnection=connection,
        )
        return connection

    def add_joint(self, joint: JointSpec, carrier: MemberSpec, curve_members: list):
        """The point connection, holding nothing, of the carried member's end and the carrier's
        curve member (at the vertex the carried member's edge ends on)."""
        connection = self.rooted(
            "IfcStructuralPointConnection", Name=f"{joint.carried} on {joint.carrier}", Description=joint.description,
            ObjectPlacement=self.shared_placement,
            Representation=self.topology_shape("Vertex", self.vertex(carrier, joint.x)),
        )
        for curve_member in curve_members:
            self.rooted(
                "IfcRelConnectsStructuralMember",
                RelatingStructuralMember=curve_member, RelatedStructuralConnection=connection,
            )
        return connection

    def add_line_load(self, member_name: str, load: LineLoadSpec, curve_member) -> None:
        """A uniform load over the whole member: LinearForceZ negative (downward), lbf/ft."""
        applied = self.model.create_entity(
            "IfcStructuralLoadLinearForce", Name=f"{load.load_type} {load.w:.4g} plf",
            LinearForceZ=-self.units.convert("linear_force", load.w),
        )
        action = self.rooted(
            "IfcStructuralCurveAction", Name=f"{member_name} {load.load_type} uniform",
            ObjectPlacement=self.shared_placement, AppliedLoad=applied, GlobalOrLocal="GLOBAL_COORDS",
            ProjectedOrTrue="TRUE_LENGTH", PredefinedType="CONST",
        )
        self.add_action(curve_member, action, load.load_type)

    def add_point_load(self, member_name: str, load: PointLoadSpec, curve_member, vertex) -> None:
        """A concentrated load at a vertex on the member: ForceZ negative (downward), lbf (the
        model's force unit)."""
        applied = self.model.create_entity(
            "IfcStructuralLoadSingleForce", Name=f"{load.load_type} {load.P:.4g} lbf", ForceZ=-load.P
        )
        action = self.rooted(
            "IfcStructuralPointAction", Name=f"{member_name} {load.load_type} at {self.geometry.length(load.x):g} ft",
            ObjectPlacement=self.shared_placement, Representation=self.topology_shape("Vertex", vertex),
            AppliedLoad=applied, GlobalOrLocal="GLOBAL_COORDS",
        )
        self.add_action(curve_member, action, load.load_type)

    def add_action(self, curve_member, action, load_type: str) -> None:
        """Connect an action to its curve member and note it for its load case's group."""
        self.rooted("IfcRelConnectsStructuralActivity", RelatingElement=curve_member, RelatedStructuralActivity=action)
        self.case_actions[load_type].append(action)

    def build_annex(self, analysed_members=ANALYSED_MEMBERS, joints=JOINTS) -> ifcopenshell.file:
        """The physical members, then the analysis model with their curve members and the joints
        between them; fixed ids and header."""
        beams = [self.add_member(analysed.member) for analysed in analysed_members]
        analysis = self.add_analysis_model()
        items, curve_members = [], {}
        for analysed, beam in zip(analysed_members, beams):
            member_items = self.add_structural_member(analysed, beam)
            curve_members[analysed.member.name] = member_items[0]
            items += member_items
        specs = {analysed.member.name: analysed.member for analysed in analysed_members}
        for joint in joints:
            pair = [curve_members[joint.carried], curve_members[joint.carrier]]
            items.append(self.add_joint(joint, specs[joint.carrier], pair))
        self.rooted("IfcRelAssignsToGroup", RelatedObjects=items, RelatingGroup=analysis)
        for load_type, case in self.load_cases.items():
            if self.case_actions[load_type]:
                self.rooted("IfcRelAssignsToGroup", RelatedObjects=self.case_actions[load_type], RelatingGroup=case)
        self.sort_unordered_sets()
        self.fix_global_ids()
        self.fix_header()
        return self.model


def build_structural_sample(out_dir: Path) -> Path:
    """Write quillfeather_annex_structural.ifc into ``out_dir``; returns its path."""
    out_dir = Path(out_dir)
    out_dir.mkdir(parents=True, exist_ok=True)
    path = out_dir / FILE_NAME
    StructuralSampleBuilder().build_annex().write(str(path))
    return path


def main(argv=None) -> None:
    parser = argparse.ArgumentParser(
        description="Build the Quillfeather Annex sample IFC model with its structural-analysis model."
    )
    parser.add_argument("out_dir", nargs="?", default=str(HERE), help="folder to write into (default: this folder)")
    args = parser.parse_args(argv)
    print(build_structural_sample(Path(args.out_dir)))


if __name__ == "__main__":
    main()
