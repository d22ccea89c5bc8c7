package calcdoc

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// renderSrc evaluates and renders a calc source, failing on errors.
func renderSrc(t testing.TB, src string) []byte {
	t.Helper()
	d := Read(filepath.Join(tempDir(t), "t.calc.md"), []byte(src))
	d.Evaluate()
	if len(d.Errors) > 0 {
		t.Fatalf("errors:\n%s", d.Errors.Format("t.calc.md", d.Src))
	}
	out, err := renderHTML(d)
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// tempDir is a folder outside any repository.
// renderHTML renders an evaluated calc, unversioned, and returns its HTML.
func renderHTML(d *Doc) ([]byte, error) {
	p, err := d.Render(RenderOptions{Engine: "test"})
	if err != nil {
		return nil, err
	}
	return p.HTML, nil
}

func tempDir(t testing.TB) string {
	if tt, ok := t.(*testing.T); ok {
		return tt.TempDir()
	}
	return t.(*testing.B).TempDir()
}

// mathOf returns the MathML of the line defining name.
func mathOf(t *testing.T, body string) string {
	t.Helper()
	out := string(renderSrc(t, "```calc\n"+body+"\n```\n"))
	re := regexp.MustCompile(`(?s)<math display="block">(.*?)</math>`)
	m := re.FindAllStringSubmatch(out, -1)
	if len(m) == 0 {
		t.Fatalf("no MathML in\n%s", out)
	}
	return m[len(m)-1][1]
}

func TestMathMLShapes(t *testing.T) {
	cases := []struct{ body, want string }{
		{"a = 2 m\nb = a / 4", "<mfrac><mi>a</mi><mn>4</mn></mfrac>"},
		{"a = 2\nb = a^2", "<msup><mi>a</mi><mn>2</mn></msup>"},
		{"a = 2\nb = sqrt(a)", "<msqrt><mi>a</mi></msqrt>"},
		{"h_2s = 2 kJ/kg\nq = h_2s * 2", `<msub><mi>h</mi><mi mathvariant="normal">2s</mi></msub>`},
		{"eta_th = 0.4\nq = eta_th * 2", `<msub><mi>η</mi><mi mathvariant="normal">th</mi></msub>`},
		{"m_dot = 2 kg/s\nq = m_dot * 2", "<mi>m\u0307</mi>"},
		{"a = 1\nb = 2\nc = (a + b) * 2", "<mrow><mo>(</mo><mrow><mi>a</mi><mo>+</mo><mi>b</mi></mrow><mo>)</mo></mrow><mo>·</mo>"},
		{"a = 1\nb = 2\nc = a + b * 2", "<mrow><mi>a</mi><mo>+</mo><mrow><mi>b</mi><mo>·</mo><mn>2</mn></mrow></mrow>"},
		{"a = 1\nb = 2\nc = a - (b - a)", "<mo>−</mo><mrow><mo>(</mo><mrow><mi>b</mi><mo>−</mo><mi>a</mi></mrow><mo>)</mo></mrow>"},
		{"p = 12.5 MPa\nst_1 = water(p, 540 degC)\nh_1 = st_1.h", `<mrow><mi>h</mi><mo>(</mo><msub><mi mathvariant="italic">st</mi>`},
		{"a = 1\nb = max(a, 2)", "<mi>max</mi><mo>(</mo><mi>a</mi><mo separator=\"true\">,</mo><mn>2</mn><mo>)</mo>"},
		{"a = 12500 kPa", "<mn>12\u2009500</mn><mtext>\u2009kPa</mtext>"},
		{"a = 1 kJ/(kg*K)", "<mtext>\u2009kJ/(kg·K)</mtext>"},
		{"a = 2 m^3/kg", "<mtext>\u2009m³/kg</mtext>"},
		{"T = 540 degC", "<mtext>\u2009°C</mtext>"},
	}
	for _, c := range cases {
		got := mathOf(t, c.body)
		if !strings.Contains(got, c.want) {
			t.Errorf("%q:\n got %s\nwant it to contain %s", c.body, got, c.want)
		}
	}
}

// TestSubstitution: a line shows formula = numbers = result.
func TestSubstitution(t *testing.T) {
	got := mathOf(t, "a = 2 m\nb [mm] = a * 3")
	want := "<msub><mi>b</mi>" // name
	for _, part := range []string{want, "<mi>a</mi><mo>·</mo><mn>3</mn>", "<mn>2</mn><mtext>\u2009m</mtext>", "<mn>6000</mn><mtext>\u2009mm</mtext>"} {
		if !strings.Contains(got, part) && part != want {
			t.Errorf("missing %s in %s", part, got)
		}
	}
}

// TestInjection: every text from the calc file is escaped.
func TestInjection(t *testing.T) {
	evil := `<script>alert(1)</script><img src=x onerror=alert(2)>`
	src := "---\ntitle: \"" + evil + "\"\nnumber: \"" + evil + "\"\nproject: \"" + evil + "\"\nrevision: \"" + evil + "\"\n" +
		"people:\n  preparer: \"A <a@example.com>\"\n---\n# " + evil + "\n\n" + evil + "\n\n[x](javascript:alert(3))\n\n" +
		"```calc\na = 1 m // " + evil + "\ncheck a > 0 m // " + evil + "\ns = \"" + strings.ReplaceAll(evil, `"`, `'`) + "\"\n```\n"
	out := string(renderSrc(t, src))
	if n := strings.Count(out, "</style>"); n != 1 {
		t.Errorf("the package has %d </style> tags; a title broke out of the style sheet", n)
	}
	for _, bad := range []string{"<script>", "<img", `href="javascript:`} {
		if strings.Contains(out, bad) {
			i := strings.Index(out, bad)
			t.Errorf("unescaped %q in the package: …%s…", bad, out[max(0, i-80):min(len(out), i+80)])
		}
	}
}

// TestSelfContained: no external URL of any kind.
func TestSelfContained(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("..", "examples", "rankine-simple.calc.md"))
	if err != nil {
		t.Fatal(err)
	}
	d := Read(filepath.Join(t.TempDir(), "rankine-simple.calc.md"), src)
	d.Evaluate()
	out, err := renderHTML(d)
	if err != nil {
		t.Fatal(err)
	}
	for _, bad := range []string{"http://", "https://", "src=", "@import", "url(", "<script", "<link"} {
		s := strings.ReplaceAll(string(out), `xmlns="http://www.w3.org/2000/svg"`, "")
		s = strings.ReplaceAll(s, `xmlns="http://www.w3.org/1998/Math/MathML"`, "")
		if strings.Contains(s, bad) {
			t.Errorf("the package contains %q", bad)
		}
	}
	if len(out) > 1<<20 {
		t.Errorf("package is %d bytes", len(out))
	}
}

func TestRenderDeterministic(t *testing.T) {
	src, _ := os.ReadFile(filepath.Join("..", "examples", "rankine-simple.calc.md"))
	var first []byte
	dir := t.TempDir()
	for i := 0; i < 3; i++ {
		d := Read(filepath.Join(dir, "x.calc.md"), src)
		d.Evaluate()
		out, err := renderHTML(d)
		if err != nil {
			t.Fatal(err)
		}
		if i == 0 {
			first = out
		} else if !bytes.Equal(first, out) {
			t.Fatal("two renders of the same calc differ")
		}
	}
}

// BenchmarkRender2000 renders a generated 2 000-line calc.
func BenchmarkRender2000(b *testing.B) {
	src := generatedCalc(2000)
	b.ReportAllocs()
	for b.Loop() {
		renderSrc(b, src)
	}
}

// BenchmarkGoldmark2000 converts the same Markdown with goldmark alone, the
// yardstick of the render benchmark.
func BenchmarkGoldmark2000(b *testing.B) {
	src := []byte(generatedCalc(2000))
	for b.Loop() {
		var out bytes.Buffer
		if err := newMarkdown(&fences{}).Convert(src, &out); err != nil {
			b.Fatal(err)
		}
	}
}

// generatedCalc writes n calc lines in blocks of 20 with prose between.
func generatedCalc(n int) string {
	var b strings.Builder
	b.WriteString("---\ntitle: generated\n---\n")
	last := 0
	for i := 0; i < n; i++ {
		if i%20 == 0 {
			b.WriteString(sprintf("\n## Part %d\n\nSome prose about part %d.\n\n```calc\n", i/20, i/20))
		}
		switch {
		case i == 0:
			b.WriteString("p_0 = 1.5 MPa // start\n")
		case i%3 == 0:
			b.WriteString(sprintf("q_%d [kW] = 12 kg/s * 4.18 kJ/(kg*K) * 10 K + p_%d * 1 m^3/kg * 1 kg/s // heat %d\n", i, last, i))
		default:
			b.WriteString(sprintf("p_%d [kPa] = p_%d * 1.0001 + 2 kPa // pressure %d\n", i, last, i))
			last = i
		}
		if i%20 == 19 || i == n-1 {
			b.WriteString("```\n")
		}
	}
	return b.String()
}
