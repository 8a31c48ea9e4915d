//! Writing a plan source: a new source for a request, the solution
//! recorded in it, and the YAML the tool writes.

use super::schema::{
    PlanSource, PointSource, RecordedPlan, RecordedVariables, SCHEMA_VERSION, VariablesSource,
};
use crate::design::{DesignRequest, Scheme, Solution, VariablesRequest, VariablesSolution};
use crate::model::{Model, ModelKind, RiskPair};

/// The first line of every source the tool writes.
const HEADER: &str = "# lotsman plan source. Edit the inputs, then re-solve with: lotsman design THIS-FILE --in-place\n";

/// The tool and version recorded as `solved_by`.
pub fn tool_version() -> String {
    format!("lotsman {}", env!("CARGO_PKG_VERSION"))
}

impl PlanSource {
    /// A new variables source for `request`, with the given title and the
    /// measurement unit.
    pub fn new_variables(title: &str, request: &VariablesRequest, unit: Option<String>) -> Self {
        let spec = request.spec();
        let mut source = Self::blank(title, Scheme::Variables, request.model(), request.risks());
        source.variables = Some(VariablesSource {
            sigma: spec.sigma_kind(),
            sigma_value: spec.sigma(),
            limit: spec.limit(),
            lower: spec.lower(),
            upper: spec.upper(),
            unit,
        });
        source
    }

    /// Records `solution` as the source's variables plan.
    pub fn record_variables(&mut self, solution: &VariablesSolution) {
        let plan = &solution.design.plan;
        self.plan = Some(RecordedPlan {
            stages: Vec::new(),
            sequential: None,
            variables: Some(RecordedVariables {
                n: plan.n(),
                k: plan.k(),
                m: plan.m(),
            }),
            code_letter: None,
            classes: Vec::new(),
            producer_risk: Some(solution.design.producer_risk),
            consumer_risk: Some(solution.design.consumer_risk),
            ati: None,
            aoql: None,
            solved_by: tool_version(),
        });
    }

    /// A new source for `request`, with the given title and nothing else
    /// filled in.
    pub fn new(title: &str, request: &DesignRequest) -> Self {
        let mut source = Self::blank(title, request.scheme, &request.model, &request.risks);
        source.criterion = matches!(request.scheme, Scheme::Double | Scheme::Multiple)
            .then_some(request.options.criterion);
        source.second_ratio = request.options.second_ratio;
        source.stage_count = (request.scheme == Scheme::Multiple).then_some(request.options.stages);
        source
    }

    /// A source with the title, scheme, model and points, nothing else.
    fn blank(title: &str, scheme: Scheme, model: &Model, risks: &RiskPair) -> Self {
        let (producer, consumer) = (risks.producer(), risks.consumer());
        let mut source = PlanSource::bare(title, scheme, model.kind(), model.lot_size());
        source.producer = Some(PointSource {
            quality: producer.quality,
            risk: producer.risk,
        });
        source.consumer = Some(PointSource {
            quality: consumer.quality,
            risk: consumer.risk,
        });
        source
    }

    /// A source of this schema version with the title, scheme, model and lot
    /// size, and every other field empty: the start of each new source.
    pub(crate) fn bare(
        title: &str,
        scheme: Scheme,
        model: ModelKind,
        lot_size: Option<u64>,
    ) -> Self {
        PlanSource {
            schema: SCHEMA_VERSION,
            title: title.to_string(),
            id: None,
            revision: None,
            date: None,
            item: None,
            characteristic: None,
            prepared_by: None,
            approved_by: None,
            notes: None,
            scheme,
            criterion: None,
            second_ratio: None,
            stage_count: None,
            variables: None,
            rectifying: None,
            standard: None,
            model,
            lot_size,
            producer: None,
            consumer: None,
            plan: None,
        }
    }

    /// Records `solution` as the source's plan, solved by this tool version.
    pub fn record(&mut self, solution: &Solution) {
        let plan = &solution.design.plan;
        self.plan = Some(RecordedPlan {
            stages: match plan.sequential_lines() {
                Some(_) => Vec::new(),
                None => plan.stages().to_vec(),
            },
            sequential: plan.sequential_lines().copied(),
            variables: None,
            code_letter: None,
            classes: Vec::new(),
            producer_risk: Some(solution.design.producer_risk),
            consumer_risk: Some(solution.design.consumer_risk),
            ati: None,
            aoql: None,
            solved_by: tool_version(),
        });
    }

    /// The source as YAML, with the tool's header line.
    pub fn to_yaml(&self) -> String {
        // Serialising plain structs of numbers and strings cannot fail.
        let body = serde_yaml::to_string(self).unwrap_or_default();
        format!("{HEADER}{body}")
    }
}
