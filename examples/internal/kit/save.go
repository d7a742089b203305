package kit

import (
	"bufio"
	"fmt"
	"io"
	"os"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// DPI is the resolution of the PNG files.
const DPI = 150

// Save draws the plots, a grid of rows of equal length, on a page of
// width w and height h, and writes it to base+".png" and base+".svg".
// It returns the names of the files written.
func Save(base string, w, h vg.Length, rows ...[]*plot.Plot) ([]string, error) {
	if len(rows) == 0 || len(rows[0]) == 0 {
		return nil, fmt.Errorf("kit.Save %s: no plots", base)
	}
	for _, r := range rows {
		if len(r) != len(rows[0]) {
			return nil, fmt.Errorf("kit.Save %s: rows of unequal length", base)
		}
	}
	drawAll := func(c vg.CanvasSizer) {
		dc := draw.New(c)
		dc.SetColor(Paper)
		dc.Fill(dc.Rectangle.Path())
		if len(rows) == 1 && len(rows[0]) == 1 {
			rows[0][0].Draw(dc)
			return
		}
		t := draw.Tiles{Rows: len(rows), Cols: len(rows[0]), PadX: vg.Centimeter, PadY: vg.Centimeter,
			PadTop: vg.Millimeter * 3, PadBottom: vg.Millimeter * 3, PadLeft: vg.Millimeter * 3, PadRight: vg.Millimeter * 3}
		cs := plot.Align(rows, t, dc)
		for i, r := range rows {
			for j, p := range r {
				p.Draw(cs[i][j])
			}
		}
	}
	img := vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(DPI), vgimg.UseBackgroundColor(Paper))
	drawAll(img)
	svg := vgsvg.New(w, h)
	drawAll(svg)
	files := []string{base + ".png", base + ".svg"}
	if err := writeFile(files[0], vgimg.PngCanvas{Canvas: img}); err != nil {
		return nil, err
	}
	if err := writeFile(files[1], svg); err != nil {
		return nil, err
	}
	return files, nil
}

func writeFile(name string, wt io.WriterTo) error {
	f, err := os.Create(name)
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(f)
	if _, err := wt.WriteTo(bw); err != nil {
		f.Close()
		return fmt.Errorf("writing %s: %w", name, err)
	}
	if err := bw.Flush(); err != nil {
		f.Close()
		return fmt.Errorf("writing %s: %w", name, err)
	}
	return f.Close()
}
