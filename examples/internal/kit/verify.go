package kit

import (
	"encoding/xml"
	"fmt"
	"image/png"
	"io"
	"os"
	"strconv"
	"strings"
)

// CheckPNG opens a PNG file and returns its size in pixels; an error if
// it is not a PNG image.
func CheckPNG(name string) (w, h int, err error) {
	f, err := os.Open(name)
	if err != nil {
		return 0, 0, err
	}
	defer f.Close()
	cfg, err := png.DecodeConfig(f)
	if err != nil {
		return 0, 0, fmt.Errorf("%s: not a PNG image: %w", name, err)
	}
	return cfg.Width, cfg.Height, nil
}

// CheckSVG parses an SVG file as XML and returns the width and height of
// its root svg element in points (the unit gonum/plot writes), and all
// the text it shows; an error if it is not well-formed SVG.
func CheckSVG(name string) (w, h float64, texts string, err error) {
	f, err := os.Open(name)
	if err != nil {
		return 0, 0, "", err
	}
	defer f.Close()
	d := xml.NewDecoder(f)
	var sb strings.Builder
	root := true
	inText := 0
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			return 0, 0, "", fmt.Errorf("%s: not well-formed XML: %w", name, err)
		}
		switch t := tok.(type) {
		case xml.StartElement:
			if root {
				if t.Name.Local != "svg" {
					return 0, 0, "", fmt.Errorf("%s: root element %q, not svg", name, t.Name.Local)
				}
				for _, a := range t.Attr {
					v, _ := strconv.ParseFloat(strings.TrimRight(a.Value, "ptx"), 64)
					switch a.Name.Local {
					case "width":
						w = v
					case "height":
						h = v
					}
				}
				root = false
			}
			if t.Name.Local == "text" {
				inText++
			}
		case xml.EndElement:
			if t.Name.Local == "text" {
				inText--
			}
		case xml.CharData:
			if inText > 0 {
				sb.Write(t)
				sb.WriteByte('\n')
			}
		}
	}
	if root {
		return 0, 0, "", fmt.Errorf("%s: empty", name)
	}
	return w, h, sb.String(), nil
}
