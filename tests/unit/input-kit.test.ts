import { createElement as h, type ReactElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { FormStateContext } from "@/components/ui/action-form";
import { CheckboxField, ChoiceGroup, Field, NumberField, SelectField } from "@/components/ui/field";
import type { FormState } from "@/lib/actions/result";
import { fieldKeyLabel } from "@/lib/forms/field-key-label";

/** Renders a control as the server's answer `state` would show it. */
function render(control: ReactElement, state: FormState = null): string {
  return renderToStaticMarkup(
    h(
      FormStateContext.Provider,
      { value: { state, pending: false, claim: () => () => {} } },
      control,
    ),
  );
}
const failed = (fieldErrors: Record<string, string[]>): FormState => ({
  ok: false,
  message: "Some fields need attention.",
  fieldErrors,
});
const idOf = (html: string, attr: string) => html.match(new RegExp(`${attr}="([^"]+)"`))?.[1];

describe("the input kit", () => {
  it("labels a text box and shows the server's error for its own name beside it, tied by aria-describedby", () => {
    const html = render(
      h(Field, { name: "lab", label: "Analysing lab", hint: "The lab's own name." }),
      failed({ lab: ["Fill in this field."], other: ["Not mine."] }),
    );
    expect(idOf(html, "for")).toBe(idOf(html, "id"));
    expect(html).toContain('name="lab"');
    expect(html).toContain('aria-invalid="true"');
    expect(html).toContain("Fill in this field.");
    expect(html).not.toContain("Not mine.");
    const describedBy = idOf(html, "aria-describedby")!.split(" ");
    expect(describedBy).toHaveLength(2);
    for (const id of describedBy) expect(html).toContain(`id="${id}"`);
  });

  it("reads a payload editor's error by its schema path when the control has no name", () => {
    const html = render(
      h(Field, {
        label: "Name of stage 2",
        errorKey: "stages.1.name",
        value: "",
        onValueChange: () => {},
      }),
      failed({ "stages.1.name": ["At most 80 characters."] }),
    );
    expect(html).not.toContain("name=");
    expect(html).toContain("At most 80 characters.");
  });

  it("makes a number box wide enough for six digits, with its unit after it and the digits keyboard for counts", () => {
    const html = render(
      h(NumberField, { name: "counts.E", label: "Class E", unit: "particles", integer: true }),
    );
    expect(html).toContain('inputMode="numeric"');
    expect(html).toContain('type="text"');
    // 7ch holds "150000" and a sign in tabular digits; the padding is added on top (common practice).
    expect(html).toContain("min-w-[calc(7ch+1.5rem)]");
    expect(html).toMatch(/<span[^>]*>particles<\/span>/);
  });

  it("keeps a hidden label for screen readers, so a table cell's box is still named", () => {
    const html = render(
      h(NumberField, {
        label: "Setpoint of Wash temperature",
        hideLabel: true,
        value: "60",
        onValueChange: () => {},
      }),
    );
    expect(html).toMatch(/<label[^>]*class="sr-only"[^>]*>Setpoint of Wash temperature<\/label>/);
  });

  it("puts a checkbox's label after the box and its error under it", () => {
    const html = render(
      h(CheckboxField, { name: "blankMeasured", label: "Blank value measured" }),
      failed({ blankMeasured: ["Tick it."] }),
    );
    expect(html.indexOf('type="checkbox"')).toBeLessThan(html.indexOf("Blank value measured"));
    expect(idOf(html, "for")).toBe(idOf(html, "id"));
    expect(html).toContain("Tick it.");
  });

  it("offers a select's empty choice first and a group's error under its legend", () => {
    const select = render(
      h(SelectField, {
        name: "testRunId",
        label: "Test run",
        placeholder: "Choose…",
        options: [{ value: "a", label: "TR-0001" }],
      }),
    );
    expect(select.indexOf('<option value="">Choose…</option>')).toBeLessThan(
      select.indexOf("TR-0001"),
    );
    const group = render(
      h(ChoiceGroup, {
        type: "radio",
        name: "scope",
        legend: "Scope",
        defaultValues: ["read"],
        options: [
          { value: "read", label: "Read" },
          { value: "read_write", label: "Read and write" },
        ],
      }),
      failed({ scope: ["Choose one of: read, read_write."] }),
    );
    expect(group).toMatch(/<input[^>]*checked=""[^>]*value="read"\/>/);
    expect(group).not.toMatch(/<input[^>]*checked=""[^>]*value="read_write"/);
    expect(group).toContain("Choose one of: read, read_write.");
  });

  it("names a field whose error no control shows", () => {
    expect(fieldKeyLabel("blankCounts")).toBe("Blank counts");
    expect(fieldKeyLabel("rows.0.testType")).toBe("Rows 1 test type");
  });
});
